"use client";

import Link from "@/components/app-link";
import Papa from "papaparse";
import { useRef, useState } from "react";
import { useTranslations } from "next-intl";
import { decodeCsvBytes, type CsvEncoding, type DecodedCsv } from "@/lib/csv-encoding";
import { createLineCollector, csvText, IMPORT_COLUMNS, MAX_IMPORT_BYTES, MAX_IMPORT_ROWS, saveCsvFile, TEMPLATE_EXAMPLES, type CsvLine, type ImportKind } from "@/lib/validation/csv";
import type { ImportReport, RowProblem } from "@/server/records/csv-import";

type ParsedFile = { name: string; encoding: CsvEncoding; header: string[]; rows: CsvLine[]; parseErrors: Map<number, string[]> };
type Phase = "idle" | "reading" | "checking" | "checked" | "committing" | "done";
type Answer = { ok: boolean; status: number; body: Partial<ImportReport> & { error?: { message: string; fields?: Record<string, string[]> } } };

// The decoded text is parsed in chunks; between chunks the page repaints the progress bar.
const CHUNK_CHARS = 64 * 1024;
const SHOWN_ROWS = 500;
// Rows are checked a slice per request, so the bar follows the server's checking.
const CHECK_SLICE_ROWS = 500;

async function send(url: string, body: unknown, idempotencyKey?: string): Promise<Answer> {
  try {
    const response = await fetch(url, {
      method: "POST",
      headers: { "content-type": "application/json", ...(idempotencyKey ? { "idempotency-key": idempotencyKey } : {}) },
      body: JSON.stringify(body),
    });
    return { ok: response.ok, status: response.status, body: await response.json().catch(() => ({})) };
  } catch {
    return { ok: false, status: 0, body: {} };
  }
}

/** Choose a kind and a file; every row is checked on the server before the one button that writes them all. */
export function ImportWorkbench({ kinds }: { kinds: ImportKind[] }) {
  const t = useTranslations("csv.import");
  const [kind, setKind] = useState<ImportKind>(kinds[0]!);
  const [phase, setPhase] = useState<Phase>("idle");
  const [progress, setProgress] = useState(0);
  const [checked, setChecked] = useState(0);
  const [file, setFile] = useState<ParsedFile | null>(null);
  const [report, setReport] = useState<ImportReport | null>(null);
  const [failure, setFailure] = useState<string[]>([]);
  const [inputKey, setInputKey] = useState(0);
  const commitKey = useRef("");
  // How long the rows took to check: a commit runs the same rows, so it should take about as long.
  const checkMs = useRef(0);

  const messagesOf = (answer: Answer) => {
    const fields = Object.values(answer.body.error?.fields ?? {}).flat();
    return fields.length ? fields : [answer.body.error?.message ?? t("failed")];
  };

  async function check(parsed: ParsedFile, asKind: ImportKind) {
    setPhase("checking");
    setReport(null);
    setFailure([]);
    setProgress(0);
    setChecked(0);
    const started = performance.now();
    // A clash between rows of different slices shows at commit, as it would between the server's own chunks.
    const problems: RowProblem[] = [];
    for (let from = 0; from < parsed.rows.length; from += CHECK_SLICE_ROWS) {
      const rows = parsed.rows.slice(from, from + CHECK_SLICE_ROWS);
      const answer = await send("/api/import/preview", { kind: asKind, header: parsed.header, rows });
      if (!answer.ok) {
        setFailure(messagesOf(answer));
        return setPhase("idle");
      }
      problems.push(...(answer.body.problems ?? []));
      setChecked(from + rows.length);
      setProgress((from + rows.length) / parsed.rows.length);
    }
    checkMs.current = performance.now() - started;
    setReport({ kind: asKind, rows: parsed.rows.length, committed: false, problems, created: [] });
    commitKey.current = crypto.randomUUID();
    setPhase("checked");
  }

  const refusal = (decoded: Exclude<DecodedCsv, { ok: true }>) =>
    decoded.reason === "undecodable" ? t("undecodable") : t(decoded.reason === "replacement" ? "replacementChar" : "controlChar", { line: decoded.line });

  async function read(chosen: File) {
    setFile(null);
    setReport(null);
    setFailure([]);
    if (chosen.size > MAX_IMPORT_BYTES) return setFailure([t("tooLarge")]);
    setPhase("reading");
    setProgress(0);
    // Decoded whole before parsing: papaparse reading a File slices it by bytes, which can cut a character in two.
    const decoded = decodeCsvBytes(new Uint8Array(await chosen.arrayBuffer()));
    if (!decoded.ok) {
      setFailure([refusal(decoded)]);
      return setPhase("idle");
    }
    parse(chosen.name, decoded.encoding, decoded.text);
  }

  function parse(name: string, encoding: CsvEncoding, text: string) {
    const collector = createLineCollector();
    const parseErrors = new Map<number, string[]>();
    let chunks = 0;
    let tooMany = false;
    let finished = false;
    Papa.parse<string[]>(text, {
      worker: false,
      header: false,
      skipEmptyLines: false,
      chunkSize: CHUNK_CHARS,
      chunk(results: Papa.ParseResult<string[]>, parser: Papa.Parser) {
        const lines = collector.add(results.data, results.meta.linebreak);
        for (const e of results.errors) {
          if (e.type === "Delimiter") continue;
          const line = lines[e.row ?? -1] ?? lines.at(-1) ?? 1;
          parseErrors.set(line, [...(parseErrors.get(line) ?? []), e.message]);
        }
        chunks += 1;
        setProgress(Math.min(1, (chunks * CHUNK_CHARS) / Math.max(text.length, 1)));
        if (collector.rows.length > MAX_IMPORT_ROWS) {
          tooMany = true;
          return parser.abort();
        }
        // A string is parsed in one go unless paused: resuming on a timer lets the bar repaint.
        parser.pause();
        setTimeout(() => parser.resume(), 0);
      },
      complete() {
        if (finished) return;
        finished = true;
        setProgress(1);
        const failed = tooMany ? t("tooManyRows") : !collector.header || collector.rows.length === 0 ? t("empty") : null;
        if (failed) {
          setFailure([failed]);
          return setPhase("idle");
        }
        const parsed = { name, encoding, header: collector.header!, rows: collector.rows, parseErrors };
        setFile(parsed);
        void check(parsed, kind);
      },
      error() {
        setFailure([t("unreadable")]);
        setPhase("idle");
      },
    });
  }

  async function commit() {
    if (!file) return;
    setPhase("committing");
    setFailure([]);
    setProgress(0);
    // One request writes every row or none, so the server cannot report as it goes: the bar
    // follows the time the check took, and stops short of the end until the answer comes.
    const started = performance.now();
    const timer = setInterval(() => setProgress(Math.min(0.95, (performance.now() - started) / Math.max(checkMs.current, 1))), 100);
    const answer = await send("/api/import/commit", { kind, header: file.header, rows: file.rows }, commitKey.current).finally(() => clearInterval(timer));
    if (answer.ok) {
      setReport(answer.body as ImportReport);
      return setPhase("done");
    }
    // Something changed since the check: the answer names the rows that now fail.
    if (answer.body.problems) setReport(answer.body as ImportReport);
    setFailure([answer.body.error?.message ?? t("failed")]);
    setPhase("checked");
  }

  function startOver() {
    setFile(null);
    setReport(null);
    setFailure([]);
    setPhase("idle");
    setInputKey((k) => k + 1);
  }

  const busy = phase === "reading" || phase === "checking" || phase === "committing";
  return (
    <div className="space-y-6">
      <section className="panel space-y-4">
        <fieldset disabled={busy || phase === "done"}>
          <legend className="field-label">{t("kind")}</legend>
          <div className="flex flex-wrap gap-4">
            {kinds.map((k) => (
              <label key={k} className="flex items-center gap-2">
                <input type="radio" name="kind" value={k} checked={kind === k} onChange={() => { setKind(k); if (file) void check(file, k); }} />
                {t(`kinds.${k}`)}
              </label>
            ))}
          </div>
          <p className="mt-1 text-sm text-ink-soft">{t(`kindHints.${kind}`)}</p>
        </fieldset>
        <div>
          <label htmlFor="csv-file" className="field-label">{t("file")}</label>
          <input key={inputKey} id="csv-file" type="file" accept=".csv,text/csv" className="field-input" disabled={busy || phase === "done"} onChange={(e) => e.target.files?.[0] && void read(e.target.files[0])} />
          <p className="mt-1 text-sm text-ink-soft">{t("fileHint")}</p>
        </div>
        <TemplateButtons kinds={kinds} />
        {busy ? (
          <div>
            <label htmlFor="csv-progress" className="text-sm">{t(phase)}</label>
            <progress id="csv-progress" className="block w-full" max={1} value={progress} />
            {phase === "checking" && file ? <p className="mt-1 text-sm text-ink-soft" data-testid="import-checked">{t("checkedRows", { done: checked, total: file.rows.length })}</p> : null}
          </div>
        ) : null}
      </section>
      {failure.length ? (
        <div role="alert" className="notice-warn">
          {failure.map((m) => <p key={m}>{m}</p>)}
        </div>
      ) : null}
      {phase === "done" && report ? <Committed report={report} onAgain={startOver} /> : null}
      {file && report && phase !== "done" ? <Preview file={file} report={report} busy={busy} onCommit={commit} /> : null}
    </div>
  );
}

function TemplateButtons({ kinds }: { kinds: ImportKind[] }) {
  const t = useTranslations("csv.import");
  return (
    <div>
      <p className="field-label">{t("templates")}</p>
      <div className="flex flex-wrap gap-2">
        {kinds.map((k) => (
          <button key={k} type="button" className="btn-quiet" onClick={() => saveCsvFile(`grainline-${k}-template.csv`, csvText([...IMPORT_COLUMNS[k].all], [TEMPLATE_EXAMPLES[k]]))}>
            {t("template", { kind: t(`kinds.${k}`) })}
          </button>
        ))}
      </div>
    </div>
  );
}

function Preview({ file, report, busy, onCommit }: { file: ParsedFile; report: ImportReport; busy: boolean; onCommit: () => void }) {
  const t = useTranslations("csv.import");
  const problems = new Map<number, RowProblem>(report.problems.map((p) => [p.line, p]));
  const failing = (line: number) => problems.has(line) || file.parseErrors.has(line);
  const failures = file.rows.filter((r) => failing(r.line)).length;
  const [onlyProblems, setOnlyProblems] = useState(true);
  const rows = onlyProblems && failures ? file.rows.filter((r) => failing(r.line)) : file.rows;
  const shown = rows.slice(0, SHOWN_ROWS);
  const column = (name: string) => name.replace(/^\uFEFF/, "").trim().toLowerCase();
  return (
    <section className="space-y-3" aria-labelledby="preview-title">
      <h2 id="preview-title" className="text-xl font-bold">{t("summary", { rows: file.rows.length, file: file.name })}</h2>
      <p className="text-sm" data-testid="import-encoding">{t("encoding", { encoding: file.encoding })}</p>
      <p className={failures ? "notice-warn" : "notice"} data-testid="import-summary">{t("problems", { count: failures })}</p>
      {failures ? (
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" checked={onlyProblems} onChange={(e) => setOnlyProblems(e.target.checked)} />
          {t("onlyProblems")}
        </label>
      ) : null}
      <div className="overflow-x-auto rounded-lg border-2 border-paper-deep bg-white">
        <table className="w-full border-collapse text-sm">
          <thead className="bg-paper-deep text-left">
            <tr>
              <th scope="col" className="px-3 py-2">{t("line")}</th>
              {file.header.map((h, i) => <th key={i} scope="col" className="px-3 py-2">{h}</th>)}
              <th scope="col" className="px-3 py-2">{t("problemsColumn")}</th>
            </tr>
          </thead>
          <tbody>
            {shown.map((row) => {
              const fields = problems.get(row.line)?.fields ?? {};
              const bad = new Set(Object.keys(fields).map((k) => k.toLowerCase()));
              const notes = [
                ...(file.parseErrors.get(row.line) ?? []),
                ...Object.entries(fields).map(([k, msgs]) => (k === "_" ? msgs.join(" ") : `${k}: ${msgs.join(" ")}`)),
              ];
              return (
                <tr key={row.line} className="border-t border-paper-deep align-top">
                  <th scope="row" className="px-3 py-2 font-mono">{row.line}</th>
                  {file.header.map((h, i) => (
                    <td key={i} className={`px-3 py-2 ${bad.has(column(h)) ? "bg-persimmon-pale font-semibold" : ""}`}>{row.cells[i] ?? ""}</td>
                  ))}
                  <td className="px-3 py-2 text-persimmon">{notes.map((n) => <p key={n}>{n}</p>)}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      {rows.length > shown.length ? <p className="text-sm text-ink-soft">{t("shown", { shown: shown.length, total: rows.length })}</p> : null}
      <button type="button" className="btn" disabled={busy || failures > 0} onClick={onCommit}>
        {t("commit", { count: file.rows.length })}
      </button>
    </section>
  );
}

function Committed({ report, onAgain }: { report: ImportReport; onAgain: () => void }) {
  const t = useTranslations("csv.import");
  return (
    <section className="panel space-y-3" role="status">
      <p className="font-semibold">{t("committed", { count: report.rows })}</p>
      <h2 className="text-lg font-bold">{report.kind === "harvests" ? t("createdLots") : t("receivedLots")}</h2>
      <ul className="flex flex-wrap gap-2" data-testid="import-created">
        {/* One link a lot: thousands would hold the page, so a long file shows its first. */}
        {report.created.slice(0, SHOWN_ROWS).map((c) => (
          <li key={`${c.line}-${c.code}`}>
            <Link href={`/lots/${c.code}`} className="code-chip no-underline">{c.code}</Link>
          </li>
        ))}
      </ul>
      {report.created.length > SHOWN_ROWS ? <p className="text-sm text-ink-soft">{t("shown", { shown: SHOWN_ROWS, total: report.created.length })}</p> : null}
      <button type="button" className="btn-quiet" onClick={onAgain}>{t("startOver")}</button>
    </section>
  );
}
