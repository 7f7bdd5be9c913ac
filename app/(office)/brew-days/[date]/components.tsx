"use client";

import Link from "@/components/app-link";
import { useFormatter, useLocale, useTranslations } from "next-intl";
import { formatAmount } from "@/lib/quantity";
import { BandChart, type BandChartPoint, type BandChartText } from "@/components/band-chart";
import { KOJI_CHECKPOINTS, RICE_USES, type Band, type BandCheck } from "@/domain/brewing";
import type { DrawnRow, KojiCheckRow, LaterRow, SoakRow, SplitRow, SteamRow } from "@/server/floor/brew-days";

type Marked = { eventId: number; at: string; corrected: boolean; correctionReason: string | null };

function useFigures() {
  const t = useTranslations("brewDays");
  const format = useFormatter();
  const locale = useLocale();
  // formatAmount: a figure rounding to zero reads 0, never -0.
  const n = (v: number | null, unit = "") => (v === null || Number.isNaN(v) ? "—" : `${formatAmount(locale, v, 1)}${unit ? ` ${unit}` : ""}`);
  return {
    t,
    n,
    time: (at: string) => format.dateTime(new Date(at), { timeStyle: "short" }),
    band: (b: Band | null, unit: string) => (b ? `${b.min}–${b.max} ${unit}` : "—"),
  };
}

function LotLink({ code }: { code: string }) {
  return <Link href={`/lots/${encodeURIComponent(code)}`} className="code-chip">{code}</Link>;
}

/** A judgement in words, and in persimmon when outside: colour is never the only sign. */
function Check({ check }: { check: BandCheck | null }) {
  const t = useTranslations("brewDays");
  if (check === "above" || check === "below") return <strong className="text-persimmon" data-check={check}>{check === "above" ? "▲" : "▼"} {t(`checks.${check}`)}</strong>;
  return <span data-check={check ?? "none"}>{t(check === "within" ? "checks.within" : "checks.none")}</span>;
}

/** Headers ending in "#" head a column of figures, set flush right like the figures. */
function Table({ headers, testId, children }: { headers: string[]; testId: string; children: React.ReactNode }) {
  return (
    <div className="overflow-x-auto rounded-lg border-2 border-paper-deep bg-white">
      <table className="w-full border-collapse text-sm" data-testid={testId}>
        <thead className="bg-paper-deep text-left">
          <tr>{headers.map((h) => <th key={h} scope="col" className={`px-3 py-2 ${h.endsWith("#") ? "text-right" : ""}`}>{h.replace(/#$/, "")}</th>)}</tr>
        </thead>
        <tbody>{children}</tbody>
      </table>
    </div>
  );
}

/** A row of the ledger; a corrected one is struck through and says so in words. */
function Row({ row, children }: { row: Marked; children: React.ReactNode }) {
  const { t, time } = useFigures();
  return (
    <tr className={`border-t border-paper-deep align-top ${row.corrected ? "text-ink-soft line-through" : ""}`} data-corrected={row.corrected || undefined}>
      <td className="px-3 py-2 whitespace-nowrap">
        {time(row.at)}
        {/* An inline-block is not struck through with its row: the note stays readable. */}
        {row.corrected ? <><br /><span className="mt-1 inline-block rounded bg-paper-deep px-1 text-xs text-ink">{t("corrected", { reason: row.correctionReason ?? "" })}</span></> : null}
      </td>
      {children}
    </tr>
  );
}

const td = "px-3 py-2";
const num = "px-3 py-2 text-right tabular-nums";

export function DrawnTable({ rows }: { rows: DrawnRow[] }) {
  const { t, n } = useFigures();
  const total = rows.reduce((a, r) => a + r.kg, 0);
  return (
    <Table testId="drawn" headers={[t("drawn.lot"), t("drawn.variety"), `${t("drawn.polishingRatio")}#`, `${t("drawn.kg")}#`, t("drawn.uses")]}>
      {rows.map((r) => (
        <tr key={r.lot} className="border-t border-paper-deep">
          <td className={td}><LotLink code={r.lot} /></td>
          <td className={td}>{r.variety ?? "—"}</td>
          <td className={num}>{n(r.polishingRatioPct, "%")}</td>
          <td className={num}>{n(r.kg, "kg")}</td>
          <td className={td}>{r.uses.map((u) => t(`uses.${u}`)).join(", ")}</td>
        </tr>
      ))}
      <tr className="border-t-2 border-husk font-semibold">
        <td className={td} colSpan={3}>{t("drawn.total")}</td>
        <td className={num}>{n(total, "kg")}</td>
        <td />
      </tr>
    </Table>
  );
}

export function SoakTable({ rows }: { rows: SoakRow[] }) {
  const { t, n, band } = useFigures();
  return (
    <Table testId="soaks" headers={[t("time"), t("from"), t("made"), t("use"), `${t("soaked.dryKg")}#`, `${t("soaked.drainedKg")}#`, `${t("soaked.absorption")}#`, `${t("band")}#`, t("check"), `${t("soaked.minutes")}#`, `${t("soaked.waterTemp")}#`]}>
      {rows.map((r) => (
        <Row key={r.eventId} row={r}>
          <td className={td}><LotLink code={r.lot} /></td>
          <td className={td}><LotLink code={r.made} /></td>
          <td className={td}>{t(`uses.${r.use ?? "mixed"}`)}</td>
          <td className={num}>{n(r.dryKg, "kg")}</td>
          <td className={num}>{n(r.drainedKg, "kg")}</td>
          <td className={num}>{n(r.absorptionPct, "%")}</td>
          <td className={num}>{band(r.band, "%")}</td>
          <td className={td}><Check check={r.bandCheck} /></td>
          <td className={num}>{n(r.soakMinutes, "min")}</td>
          <td className={num}>{n(r.waterTempC, "°C")}</td>
        </Row>
      ))}
    </Table>
  );
}

export function SteamTable({ rows }: { rows: SteamRow[] }) {
  const { t, n, band } = useFigures();
  return (
    <Table testId="steams" headers={[t("time"), t("from"), t("made"), t("use"), `${t("steamed.dryKg")}#`, `${t("steamed.steamedKg")}#`, `${t("steamed.gain")}#`, `${t("band")}#`, t("check"), `${t("steamed.minutes")}#`]}>
      {rows.map((r) => (
        <Row key={r.eventId} row={r}>
          <td className={td}><span className="flex flex-wrap gap-1">{r.lots.map((l) => <LotLink key={l} code={l} />)}</span></td>
          <td className={td}><LotLink code={r.made} /></td>
          <td className={td}>{r.use ? t(`uses.${r.use}`) : "—"}</td>
          <td className={num}>{n(r.dryKg, "kg")}</td>
          <td className={num}>{n(r.steamedKg, "kg")}</td>
          <td className={num}>{n(r.gainPct, "%")}</td>
          <td className={num}>{band(r.band, "%")}</td>
          <td className={td}><Check check={r.bandCheck} /></td>
          <td className={num}>{n(r.steamMinutes, "min")}</td>
        </Row>
      ))}
    </Table>
  );
}

export function SplitTable({ rows }: { rows: SplitRow[] }) {
  const { t, n } = useFigures();
  return (
    <Table testId="splits" headers={[t("time"), t("from"), `${t("split.kgIn")}#`, t("split.portions")]}>
      {rows.map((r) => (
        <Row key={r.eventId} row={r}>
          <td className={td}><LotLink code={r.lot} /></td>
          <td className={num}>{n(r.kg, "kg")}</td>
          <td className={td}>
            <ul className="space-y-1">
              {r.portions.map((p) => (
                <li key={p.lot} className="flex flex-wrap items-center gap-2">
                  <LotLink code={p.lot} />
                  <span>{t(`uses.${p.use}`)}{p.addition ? ` · ${t(`additions.${p.addition}`)}` : ""}{p.tank ? ` · ${p.tank}` : ""}</span>
                  <span className="tabular-nums">{n(p.kg, "kg")}</span>
                </li>
              ))}
            </ul>
          </td>
        </Row>
      ))}
    </Table>
  );
}

export function KojiTable({ rows }: { rows: KojiCheckRow[] }) {
  const { t, n, band } = useFigures();
  return (
    <Table testId="koji-checks" headers={[t("time"), t("koji.lot"), t("koji.checkpoint"), `${t("koji.temperature")}#`, `${t("band")}#`, t("check")]}>
      {rows.map((r) => (
        <Row key={`${r.eventId}-${r.checkpoint}`} row={r}>
          <td className={td}><LotLink code={r.lot} /></td>
          <td className={td}>{t(`checkpoints.${r.checkpoint}`)}</td>
          <td className={num}>{n(r.value, "°C")}</td>
          <td className={num}>{band(r.band, "°C")}</td>
          <td className={td}><Check check={r.bandCheck} /></td>
        </Row>
      ))}
    </Table>
  );
}

export function LaterTable({ rows }: { rows: LaterRow[] }) {
  const { t, n } = useFigures();
  const list = (items: { lot: string; quantity: number; unit: string }[]) => (
    <ul className="space-y-1">{items.map((i) => <li key={i.lot} className="flex items-center gap-2"><LotLink code={i.lot} /><span className="tabular-nums">{n(i.quantity, i.unit)}</span></li>)}</ul>
  );
  return (
    <Table testId="later-steps" headers={[t("time"), t("later.step"), t("later.inputs"), t("later.outputs")]}>
      {rows.map((r) => (
        <Row key={r.eventId} row={r}>
          <td className={td}>{t(`stepNames.${r.step}`)}</td>
          <td className={td}>{list(r.inputs)}</td>
          <td className={td}>{list(r.outputs)}</td>
        </Row>
      ))}
    </Table>
  );
}

function useChartText(): BandChartText {
  const t = useTranslations("brewDays.chart");
  const c = useTranslations("brewDays.checks");
  return { tableSummary: t("tableSummary"), item: t("item"), group: t("group"), value: t("value"), band: t("band"), check: t("check"), above: c("above"), below: c("below"), within: c("within"), noBand: c("none"), legendBand: t("legendBand") };
}

/** Corrected events are not plotted: the chart shows what stands. */
function ChartOf({ id, kind, unit, groups, points }: { id: string; kind: "absorption" | "gain" | "koji"; unit: string; groups: { key: string; label: string }[]; points: BandChartPoint[] }) {
  const t = useTranslations("brewDays.chart");
  const text = useChartText();
  if (!points.length) return null;
  const outside = points.filter((p) => p.check === "above" || p.check === "below").length;
  const desc = t(`${kind}Desc`, { count: points.length, outside, within: points.filter((p) => p.check === "within").length });
  return <BandChart id={id} title={t(`${kind}Title`)} desc={desc} unit={unit} groups={groups} points={points} text={text} />;
}

export function AbsorptionChart({ rows }: { rows: SoakRow[] }) {
  const t = useTranslations("brewDays");
  // Rice soaked for several uses ("mixed", portioned at the split) is held to the span of their bands.
  const points = rows.filter((r) => !r.corrected).map((r) => ({ id: String(r.eventId), group: r.use ?? "mixed", label: r.lot, value: r.absorptionPct, band: r.band, check: r.bandCheck }));
  const groups = [...RICE_USES.map((u) => ({ key: u, label: t(`uses.${u}`) })), { key: "mixed", label: t("uses.mixed") }];
  return <ChartOf id="absorption-chart" kind="absorption" unit="%" groups={groups} points={points} />;
}

export function GainChart({ rows }: { rows: SteamRow[] }) {
  const t = useTranslations("brewDays");
  const points = rows.filter((r) => !r.corrected).map((r) => ({ id: String(r.eventId), group: r.use ?? "unknown", label: r.lots.join(" + "), value: r.gainPct, band: r.band, check: r.bandCheck }));
  const groups = [...RICE_USES.map((u) => ({ key: u, label: t(`uses.${u}`) })), { key: "unknown", label: t("uses.unknown") }];
  return <ChartOf id="gain-chart" kind="gain" unit="%" groups={groups} points={points} />;
}

export function KojiChart({ rows }: { rows: KojiCheckRow[] }) {
  const t = useTranslations("brewDays");
  const points = rows.filter((r) => !r.corrected).map((r) => ({ id: `${r.eventId}-${r.checkpoint}`, group: r.checkpoint, label: r.lot, value: r.value, band: r.band, check: r.bandCheck }));
  return <ChartOf id="koji-chart" kind="koji" unit="°C" groups={KOJI_CHECKPOINTS.map((c) => ({ key: c, label: t(`checkpoints.${c}`) }))} points={points} />;
}
