"use client";

import { useTranslations } from "next-intl";
import { useEffect, useState } from "react";

/**
 * Times a soak: start and stop fill the minutes. The start time is kept on the phone (not a
 * running counter), so a locked screen or a reload loses nothing. Short ginjo soaks are timed to
 * the second (common practice), so the minutes are filled with fractions: 7 min 30 s is 7.5.
 */
const keyOf = (lot: string) => `grainline:soak-timer:${lot}`;

export function minutesBetween(startMs: number, endMs: number): number {
  const seconds = Math.max(0, Math.round((endMs - startMs) / 1000));
  return Math.round((seconds / 60) * 100) / 100;
}

export function SoakTimer({ lot, onMinutes }: { lot: string; onMinutes: (minutes: string) => void }) {
  const t = useTranslations("floorForms.timer");
  const [start, setStart] = useState<number | null>(null);
  const [now, setNow] = useState(() => Date.now());

  useEffect(() => {
    const kept = Number(window.localStorage.getItem(keyOf(lot)));
    if (kept > 0) setStart(kept);
  }, [lot]);
  useEffect(() => {
    if (start === null) return;
    const tick = window.setInterval(() => setNow(Date.now()), 500);
    return () => window.clearInterval(tick);
  }, [start]);

  const begin = () => {
    const at = Date.now();
    window.localStorage.setItem(keyOf(lot), String(at));
    setStart(at);
    setNow(at);
  };
  const stop = () => {
    if (start === null) return;
    onMinutes(String(minutesBetween(start, Date.now())));
    window.localStorage.removeItem(keyOf(lot));
    setStart(null);
  };
  const seconds = start === null ? 0 : Math.max(0, Math.floor((now - start) / 1000));

  return (
    <div className="mt-2 flex flex-wrap items-center gap-3" data-testid="soak-timer">
      {start === null ? (
        <button type="button" className="btn-quiet min-h-12" onClick={begin}>{t("start")}</button>
      ) : (
        <>
          <span role="timer" aria-live="off" className="font-[family-name:var(--font-code)] text-2xl" data-testid="soak-elapsed" suppressHydrationWarning>
            {t("elapsed", { minutes: Math.floor(seconds / 60), seconds: seconds % 60 })}
          </span>
          <button type="button" className="btn min-h-12" onClick={stop}>{t("stop")}</button>
        </>
      )}
    </div>
  );
}
