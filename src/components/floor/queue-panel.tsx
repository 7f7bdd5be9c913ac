"use client";

import { useTranslations } from "next-intl";
import { useEffect, useState } from "react";
import { discardQueuedWrite, setQueueOwner, useQueueAutoFlush, useQueuedWrites } from "@/lib/offline-queue";
import { FloorLink } from "./floor-link";

function useOnline(): boolean {
  const [online, setOnline] = useState(true);
  useEffect(() => {
    const update = () => setOnline(navigator.onLine);
    update();
    window.addEventListener("online", update);
    window.addEventListener("offline", update);
    return () => {
      window.removeEventListener("online", update);
      window.removeEventListener("offline", update);
    };
  }, []);
  return online;
}

/** Floor records kept on this phone until they reach the server; nothing shows while none wait. */
export function QueuePanel({ userId }: { userId: string }) {
  const t = useTranslations("floorScan.queue");
  useEffect(() => setQueueOwner(userId), [userId]);
  const { items, flush } = useQueuedWrites();
  useQueueAutoFlush(items.length);
  const online = useOnline();
  const [sending, setSending] = useState(false);

  if (items.length === 0) return null;
  const sendNow = async () => {
    setSending(true);
    try {
      await flush();
    } finally {
      setSending(false);
    }
  };

  return (
    <section aria-labelledby="queue-title" data-testid="queue-panel" className="border-b-4 border-koji bg-koji-pale px-4 py-3 text-ink">
      <div className="mx-auto max-w-xl space-y-2">
        <h2 id="queue-title" className="sr-only">{t("title")}</h2>
        <div className="flex flex-wrap items-center justify-between gap-3">
          <p role="status" className="text-lg font-bold" data-testid="queue-count">
            {t("waiting", { count: items.length })}
          </p>
          <button type="button" onClick={sendNow} className="btn min-h-12 px-5 text-lg">
            {sending ? t("sending") : t("sendNow")}
          </button>
        </div>
        {!online ? <p>{t("offline")}</p> : null}
        <ul className="space-y-1">
          {items.map((item) => (
            <li key={item.id} className="flex flex-wrap items-center justify-between gap-2">
              <span>
                {item.label}
                {item.lastError ? <span className="block font-semibold text-persimmon">{t("refused", { error: item.lastError })}</span> : null}
              </span>
              {item.lastError ? (
                <span className="flex flex-wrap gap-2">
                  {item.fixHref ? <FloorLink href={item.fixHref} className="btn min-h-12 px-3">{t("fix")}</FloorLink> : null}
                  <DiscardButton id={item.id} />
                </span>
              ) : null}
            </li>
          ))}
        </ul>
      </div>
    </section>
  );
}

/** A discarded record is gone for good, so the first tap only asks; the second, within 5 s, discards. */
function DiscardButton({ id }: { id: string }) {
  const t = useTranslations("floorScan.queue");
  const [asking, setAsking] = useState(false);
  useEffect(() => {
    if (!asking) return;
    const timer = window.setTimeout(() => setAsking(false), 5000);
    return () => window.clearTimeout(timer);
  }, [asking]);
  return (
    <button type="button" onClick={() => (asking ? void discardQueuedWrite(id) : setAsking(true))} className={`${asking ? "btn" : "btn-quiet"} min-h-12 px-3`} aria-live="polite">
      {asking ? t("discardConfirm") : t("discard")}
    </button>
  );
}
