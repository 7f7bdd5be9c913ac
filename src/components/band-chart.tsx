import type { Band, BandCheck } from "@/domain/brewing";

/**
 * Values against their target bands, drawn as plain SVG: a shaded band per group (a use,
 * a koji checkpoint), a dot per value; values outside their band are persimmon and carry a
 * text marker, so the judgement never rests on colour alone. A data table follows.
 */
export type BandChartPoint = { id: string; group: string; label: string; value: number; band: Band | null; check: BandCheck | null; href?: string };
export type BandChartText = { tableSummary: string; item: string; group: string; value: string; band: string; check: string; above: string; below: string; within: string; noBand: string; legendBand: string };
type Props = { id: string; title: string; desc: string; unit: string; groups: { key: string; label: string }[]; points: BandChartPoint[]; text: BandChartText };

const W = 720;
const H = 300;
const M = { top: 24, right: 16, bottom: 56, left: 52 };
const GROUP_GAP = 24;

/** A tick step of 1, 2 or 5 × 10ⁿ that cuts the span into at most maxTicks parts. */
export function niceStep(span: number, maxTicks = 6): number {
  if (!(span > 0)) return 1;
  const raw = span / maxTicks;
  const pow = 10 ** Math.floor(Math.log10(raw));
  return ([1, 2, 5, 10].find((m) => m * pow >= raw - 1e-12) ?? 10) * pow;
}

/** The value axis: every value and band edge, a tenth of the span spare, snapped to whole ticks. */
export function chartDomain(values: number[], bands: Band[]): { lo: number; hi: number; step: number } {
  const all = [...values, ...bands.flatMap((b) => [b.min, b.max])];
  if (!all.length) return { lo: 0, hi: 100, step: 20 };
  const min = Math.min(...all);
  const max = Math.max(...all);
  const pad = Math.max((max - min) * 0.1, 1);
  const step = niceStep(max - min + 2 * pad);
  return { lo: Math.floor((min - pad) / step) * step, hi: Math.ceil((max + pad) / step) * step, step };
}

export function ticksOf(lo: number, hi: number, step: number): number[] {
  const out: number[] = [];
  for (let n = 0; lo + n * step <= hi + step * 1e-9; n++) out.push(Number((lo + n * step).toFixed(10)));
  return out;
}

export function scaleLinear([d0, d1]: [number, number], [r0, r1]: [number, number]) {
  return (v: number) => (d1 === d0 ? (r0 + r1) / 2 : r0 + ((v - d0) / (d1 - d0)) * (r1 - r0));
}

/** Equal slots for every point, groups side by side with a gap between them. */
export function slotLayout(counts: number[], x0: number, width: number, gap = GROUP_GAP) {
  const slots = counts.reduce((a, b) => a + b, 0);
  const slot = slots ? (width - gap * Math.max(0, counts.length - 1)) / slots : 0;
  let x = x0;
  return counts.map((n) => {
    const group = { start: x, end: x + n * slot, centres: Array.from({ length: n }, (_, i) => x + (i + 0.5) * slot) };
    x = group.end + gap;
    return group;
  });
}

/** Runs of neighbouring points with the same band: one shaded rectangle each. */
export function bandSegments(bands: (Band | null)[], start: number, end: number): { x0: number; x1: number; band: Band }[] {
  const slot = bands.length ? (end - start) / bands.length : 0;
  const out: { x0: number; x1: number; band: Band }[] = [];
  bands.forEach((band, i) => {
    if (!band) return;
    const last = out[out.length - 1];
    if (last && last.x1 === start + i * slot && last.band.min === band.min && last.band.max === band.max) last.x1 = start + (i + 1) * slot;
    else out.push({ x0: start + i * slot, x1: start + (i + 1) * slot, band });
  });
  return out;
}

export function BandChart({ id, title, desc, unit, groups, points, text }: Props) {
  const shown = groups.map((g) => ({ ...g, points: points.filter((p) => p.group === g.key) })).filter((g) => g.points.length);
  const { lo, hi, step } = chartDomain(points.map((p) => p.value), points.flatMap((p) => (p.band ? [p.band] : [])));
  const y = scaleLinear([lo, hi], [H - M.bottom, M.top]);
  const layout = slotLayout(shown.map((g) => g.points.length), M.left, W - M.left - M.right);
  const fmt = (v: number) => `${Number(v.toFixed(1))} ${unit}`;
  const range = (b: Band | null) => (b ? `${b.min}–${b.max} ${unit}` : text.noBand);
  const verdict = (c: BandCheck | null) => (c === "above" ? `▲ ${text.above}` : c === "below" ? `▼ ${text.below}` : c === "within" ? text.within : text.noBand);
  return (
    <figure className="space-y-2" data-testid={id}>
      <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full max-w-3xl rounded-md bg-white" role="img" aria-labelledby={`${id}-title ${id}-desc`}>
        <title id={`${id}-title`}>{title}</title>
        <desc id={`${id}-desc`}>{desc}</desc>
        {ticksOf(lo, hi, step).map((v) => (
          <g key={v}>
            <line x1={M.left} x2={W - M.right} y1={y(v)} y2={y(v)} className="stroke-paper-deep" strokeWidth={1} />
            <text x={M.left - 6} y={y(v) + 4} textAnchor="end" fontSize={12} className="fill-ink-soft">{fmt(v)}</text>
          </g>
        ))}
        {shown.map((g, gi) => {
          const box = layout[gi]!;
          return (
            <g key={g.key}>
              {bandSegments(g.points.map((p) => p.band), box.start, box.end).map((s) => (
                <rect key={s.x0} x={s.x0} width={s.x1 - s.x0} y={y(s.band.max)} height={y(s.band.min) - y(s.band.max)} className="fill-koji-pale stroke-koji" strokeDasharray="4 3" />
              ))}
              <text x={(box.start + box.end) / 2} y={H - M.bottom + 20} textAnchor="middle" fontSize={13} fontWeight={700} className="fill-ink">{g.label}</text>
              <text x={(box.start + box.end) / 2} y={H - M.bottom + 38} textAnchor="middle" fontSize={12} className="fill-ink-soft">{[...new Set(g.points.map((p) => range(p.band)))].join(" / ")}</text>
              {g.points.map((p, i) => <Dot key={p.id} x={box.centres[i]!} y={y(p.value)} point={p} label={fmt(p.value)} marker={p.check === "above" ? `▲ ${text.above}` : p.check === "below" ? `▼ ${text.below}` : null} tip={`${p.label}: ${fmt(p.value)} (${range(p.band)}) ${verdict(p.check)}`} />)}
            </g>
          );
        })}
        <line x1={M.left} x2={W - M.right} y1={H - M.bottom} y2={H - M.bottom} className="stroke-ink-soft" strokeWidth={1} />
      </svg>
      <figcaption className="flex flex-wrap gap-4 text-sm text-ink-soft">
        <span className="inline-flex items-center gap-1"><span className="inline-block h-3 w-6 border border-dashed border-koji bg-koji-pale" aria-hidden="true" />{text.legendBand}</span>
        <span className="inline-flex items-center gap-1"><span className="inline-block h-3 w-3 rounded-full bg-cedar" aria-hidden="true" />{text.within}</span>
        <span className="inline-flex items-center gap-1 font-semibold text-persimmon">▲ {text.above} / ▼ {text.below}</span>
      </figcaption>
      <details>
        <summary className="cursor-pointer text-sm font-semibold">{text.tableSummary}</summary>
        <table className="mt-2 w-full max-w-3xl border-collapse text-sm">
          <thead className="bg-paper-deep text-left">
            <tr>{[text.item, text.group, text.value, text.band, text.check].map((h) => <th key={h} scope="col" className="px-3 py-2">{h}</th>)}</tr>
          </thead>
          <tbody>
            {points.map((p) => (
              <tr key={p.id} className="border-t border-paper-deep">
                <td className="px-3 py-1">{p.label}</td>
                <td className="px-3 py-1">{groups.find((g) => g.key === p.group)?.label ?? p.group}</td>
                <td className="px-3 py-1 tabular-nums">{fmt(p.value)}</td>
                <td className="px-3 py-1 tabular-nums">{range(p.band)}</td>
                <td className={`px-3 py-1 ${p.check === "above" || p.check === "below" ? "font-semibold text-persimmon" : ""}`}>{verdict(p.check)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </details>
    </figure>
  );
}

function Dot({ x, y, point, label, marker, tip }: { x: number; y: number; point: BandChartPoint; label: string; marker: string | null; tip: string }) {
  const out = point.check === "above" || point.check === "below";
  const shape = !out ? (
    <circle cx={x} cy={y} r={6} className={point.band ? "fill-cedar" : "fill-white stroke-cedar"} strokeWidth={2} />
  ) : point.check === "above" ? (
    <path d={`M ${x} ${y - 8} L ${x + 7} ${y + 5} L ${x - 7} ${y + 5} Z`} className="fill-persimmon stroke-ink" strokeWidth={1} />
  ) : (
    <path d={`M ${x} ${y + 8} L ${x + 7} ${y - 5} L ${x - 7} ${y - 5} Z`} className="fill-persimmon stroke-ink" strokeWidth={1} />
  );
  return (
    <g data-check={point.check ?? "none"}>
      <title>{tip}</title>
      {shape}
      <text x={x} y={y - 12} textAnchor="middle" fontSize={12} className={out ? "fill-persimmon font-bold" : "fill-ink"}>{label}</text>
      {marker ? <text x={x} y={y + 22} textAnchor="middle" fontSize={11} fontWeight={700} className="fill-persimmon">{marker}</text> : null}
    </g>
  );
}
