"use client";

import { useFormatter, useTranslations } from "next-intl";
import { useCallback, useEffect, useRef, useState } from "react";
import { FloorLotCard } from "@/components/floor/floor-lot-card";
import { readRecentScans, rememberScan, RecentScans } from "@/components/floor/recent-scans";
import { Scanner } from "@/components/floor/scanner";
import { readScanText } from "@/lib/scan-text";
import type { FloorRights } from "@/domain/floor-offer";
import type { ApiLot } from "@/server/ledger/lots";

export type ScanView =
  | { state: "idle" }
  | { state: "loading"; code: string }
  | { state: "lot"; lot: ApiLot; asOf?: string }
  | { state: "not-ours"; text: string }
  | { state: "not-found" | "offline" | "signed-out" | "failed"; code: string };

/** Scan or type → the lot card. Typed codes also work without JavaScript (a GET form to /scan). */
export function ScanScreen({ userId, rights, initial, typed }: { userId: string; rights: FloorRights; initial: ScanView; typed: string }) {
  const t = useTranslations("floorScan");
  const format = useFormatter();
  const [view, setView] = useState<ScanView>(initial);
  const latest = useRef(0);
  const resultRef = useRef<HTMLDivElement>(null);
  // A lot opened by the typed-code form (a full page load) counts as scanned on this phone too.
  useEffect(() => {
    if (initial.state === "lot") rememberScan(userId, initial.lot);
  }, [initial, userId]);

  const open = useCallback(
    async (code: string) => {
      const request = ++latest.current;
      const show = (next: ScanView) => request === latest.current && setView(next);
      show({ state: "loading", code });
      resultRef.current?.scrollIntoView({ block: "start" });
      window.history.replaceState(null, "", `/scan?code=${encodeURIComponent(code)}`);
      let response: Response;
      try {
        response = await fetch(`/api/lots/${encodeURIComponent(code)}`, { cache: "no-store", headers: { accept: "application/json" } });
      } catch {
        const known = readRecentScans(userId).find((scan) => scan.code === code);
        return show(known ? { state: "lot", lot: known.lot, asOf: known.at } : { state: "offline", code });
      }
      if (response.ok) {
        const lot = (await response.json()) as ApiLot;
        rememberScan(userId, lot);
        return show({ state: "lot", lot });
      }
      show({ state: response.status === 404 ? "not-found" : response.status === 401 ? "signed-out" : "failed", code });
    },
    [userId],
  );

  const read = useCallback(
    (text: string): boolean => {
      const reading = readScanText(text);
      if (!reading) {
        setView({ state: "not-ours", text: text.slice(0, 80) });
        return false;
      }
      navigator.vibrate?.(60);
      void open(reading.code);
      return true;
    },
    [open],
  );

  return (
    <div className="space-y-6">
      {/* The answer comes first: after a scan it is what the brewer looks at, without scrolling. */}
      <div aria-live="polite" data-testid="scan-result" ref={resultRef} className="scroll-mt-4 empty:hidden">
        <ScanResult view={view} rights={rights} userId={userId} asOf={view.state === "lot" && view.asOf ? format.dateTime(new Date(view.asOf), "dayTime") : ""} />
      </div>
      <div className="grid gap-5 sm:grid-cols-2">
        <Scanner onText={read} />
        <form
          action="/scan"
          method="get"
          role="search"
          className="space-y-3"
          onSubmit={(event) => {
            const text = String(new FormData(event.currentTarget).get("code") ?? "");
            // Not a code but perhaps a tank's name ("Tank 3"): the page looks names up itself.
            if (text.trim() && !readScanText(text)) return;
            event.preventDefault();
            read(text);
          }}
        >
          <label className="block">
            <span className="block text-lg font-semibold">{t("manual.label")}</span>
            <input
              name="code"
              defaultValue={typed}
              placeholder={t("manual.placeholder")}
              autoCapitalize="characters"
              autoComplete="off"
              spellCheck={false}
              maxLength={200}
              className="field-input min-h-14 font-[family-name:var(--font-code)] text-2xl uppercase placeholder:normal-case"
            />
          </label>
          <button type="submit" className="btn min-h-14 w-full text-xl">
            {t("manual.open")}
          </button>
        </form>
      </div>
      <RecentScans userId={userId} onOpen={(code) => void open(code)} />
    </div>
  );
}

function ScanResult({ view, rights, userId, asOf }: { view: ScanView; rights: FloorRights; userId: string; asOf: string }) {
  const t = useTranslations("floorScan.result");
  switch (view.state) {
    case "idle":
      return null;
    case "loading":
      return <p className="text-xl">{t("loading", { code: view.code })}</p>;
    case "lot":
      return (
        <div className="space-y-3">
          {view.asOf ? <p role="status" className="notice-warn text-ink">{t("offline", { code: view.lot.code, time: asOf })}</p> : null}
          <FloorLotCard lot={view.lot} rights={rights} userId={userId} />
        </div>
      );
    case "not-ours":
      return <p role="alert" className="notice-warn text-ink">{t("notOurs", { text: view.text })}</p>;
    case "not-found":
      return <p role="alert" className="notice-warn text-ink">{t("notFound", { code: view.code })}</p>;
    case "offline":
      return <p role="alert" className="notice-warn text-ink">{t("offlineUnknown", { code: view.code })}</p>;
    case "signed-out":
      return <p role="alert" className="notice-warn text-ink">{t("signedOut")}</p>;
    case "failed":
      return <p role="alert" className="notice-warn text-ink">{t("failed")}</p>;
  }
}
