"use client";

import { useFormatter, useTranslations } from "next-intl";
import { useEffect, useState } from "react";
import type { ApiLot } from "@/server/ledger/lots";

/**
 * Lots opened on this phone, newest first, kept in localStorage per signed-in person. Each
 * keeps the card as last seen, so a lot can be reopened in a dead spot of the wifi.
 */
export type RecentScan = { code: string; kind: string; at: string; lot: ApiLot };
export const RECENT_SCANS_KEPT = 10;
const EVENT = "grainline:recent-scans";

const storageKey = (userId: string) => `grainline.recentScans.${userId}`;

export function readRecentScans(userId: string): RecentScan[] {
  try {
    const list = JSON.parse(localStorage.getItem(storageKey(userId)) ?? "[]");
    return Array.isArray(list) ? (list as RecentScan[]) : [];
  } catch {
    return [];
  }
}

export function rememberScan(userId: string, lot: ApiLot): void {
  const entry: RecentScan = { code: lot.code, kind: lot.kind, at: new Date().toISOString(), lot };
  const list = [entry, ...readRecentScans(userId).filter((s) => s.code !== lot.code)].slice(0, RECENT_SCANS_KEPT);
  try {
    localStorage.setItem(storageKey(userId), JSON.stringify(list));
  } catch {
    return; // storage full or disabled (private mode): the list is a convenience, the scan still works
  }
  window.dispatchEvent(new Event(EVENT));
}

export function RecentScans({ userId, onOpen }: { userId: string; onOpen: (code: string) => void }) {
  const t = useTranslations();
  const format = useFormatter();
  const [scans, setScans] = useState<RecentScan[]>([]);
  useEffect(() => {
    const refresh = () => setScans(readRecentScans(userId));
    refresh();
    window.addEventListener(EVENT, refresh);
    window.addEventListener("storage", refresh);
    return () => {
      window.removeEventListener(EVENT, refresh);
      window.removeEventListener("storage", refresh);
    };
  }, [userId]);

  return (
    <section aria-labelledby="recent-scans-title" data-testid="recent-scans">
      <h2 id="recent-scans-title" className="text-xl font-bold">{t("floorScan.recent.title")}</h2>
      {scans.length === 0 ? <p className="mt-2 opacity-80">{t("floorScan.recent.empty")}</p> : null}
      <ul className="mt-3 space-y-2">
        {scans.map((scan) => (
          <li key={scan.code}>
            <a
              href={`/scan?code=${encodeURIComponent(scan.code)}`}
              onClick={(event) => {
                event.preventDefault();
                onOpen(scan.code);
              }}
              className="flex min-h-14 items-center justify-between gap-3 rounded-md border-2 border-paper/30 px-4 py-2 text-paper no-underline hover:border-koji"
            >
              <span className="whitespace-nowrap font-[family-name:var(--font-code)] text-xl font-bold">{scan.code}</span>
              <span className="text-right text-base opacity-80">
                {t(`lot.kinds.${scan.kind}`)} · {format.dateTime(new Date(scan.at), "dayTime")}
              </span>
            </a>
          </li>
        ))}
      </ul>
    </section>
  );
}
