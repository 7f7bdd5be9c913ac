import { createStore, get, update, type UseStore } from "idb-keyval";
import { useCallback, useEffect, useState } from "react";
import { postJson, type ApiResult } from "./api-client";

/**
 * Floor writes that survive a dead spot in the brewery's wifi. Browser only: the queue is
 * kept in IndexedDB, one list per signed-in person, so a phone shared between shifts never
 * sends one brewer's records under another's session. Each write's Idempotency-Key is made
 * once and kept with it, so however often it is resent the server records it once.
 */
export type FloorWriteResult<T> = { state: "sent"; result: ApiResult<T> } | { state: "queued"; id: string };
/** The form a write came from, so a refused write opens again with what was typed. */
export type QueuedForm = { href: string; values: Record<string, string> };
export type QueuedWrite = { id: string; url: string; body: unknown; label: string; createdAt: string; form?: QueuedForm; lastStatus?: number; lastError?: string; lastFields?: Record<string, string[]> };
export type QueuedSummary = Pick<QueuedWrite, "id" | "label" | "createdAt" | "lastError"> & { fixHref?: string };

let store: UseStore | null = null;
let owner = "";
const listeners = new Set<() => void>();
const channel = typeof BroadcastChannel === "undefined" ? null : new BroadcastChannel("grainline-floor-queue");
channel?.addEventListener("message", () => listeners.forEach((listener) => listener()));

const queueStore = () => (store ??= createStore("grainline-floor", "queued-writes"));
const queueKey = () => `writes:${owner}`;
const readQueue = async () => (owner ? ((await get<QueuedWrite[]>(queueKey(), queueStore())) ?? []) : []);

async function changeQueue(change: (items: QueuedWrite[]) => QueuedWrite[]): Promise<void> {
  await update<QueuedWrite[]>(queueKey(), (items) => change(items ?? []), queueStore());
  listeners.forEach((listener) => listener());
  channel?.postMessage("changed");
}

/** Whose queue this tab works on: the floor layout sets it to the signed-in user. */
export function setQueueOwner(userId: string): void {
  if (owner === userId) return;
  owner = userId;
  listeners.forEach((listener) => listener());
}

// Status 0 is no answer at all; 502–504 come from a proxy in front of a server that did not
// answer; 408 and 429 ask to be tried again later. None of them says the write was refused.
const unanswered = (status: number) => status === 0 || status === 408 || status === 429 || (status >= 502 && status <= 504);
const refused = (item: QueuedWrite) => item.lastStatus !== undefined && item.lastStatus >= 400 && item.lastStatus < 500 && !unanswered(item.lastStatus);
const offline = () => typeof navigator !== "undefined" && navigator.onLine === false;

/** crypto.randomUUID needs a secure context; a phone on the brewery's LAN over plain http has only getRandomValues. */
function newIdempotencyKey(): string {
  if (typeof crypto.randomUUID === "function") return crypto.randomUUID();
  const b = crypto.getRandomValues(new Uint8Array(16));
  b[6] = (b[6]! & 0x0f) | 0x40; // RFC 9562 §5.4: version 4, variant 10
  b[8] = (b[8]! & 0x3f) | 0x80;
  const hex = [...b].map((x) => x.toString(16).padStart(2, "0")).join("");
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
}

/** One flush at a time across this person's tabs (Web Locks), or at least within this tab. */
let tabLock: Promise<unknown> = Promise.resolve();
function withQueueLock<T>(work: () => Promise<T>): Promise<T> {
  if (typeof navigator !== "undefined" && navigator.locks) return navigator.locks.request(`grainline-floor-queue:${owner}`, work) as Promise<T>;
  const run = tabLock.then(work, work);
  tabLock = run.catch(() => undefined);
  return run;
}

/**
 * Sends waiting writes in the order they were made. A write the server refuses (4xx) stays
 * with its error for the person to see, and is tried again only when they ask; no answer or
 * a server error (5xx) stops the round, so nothing overtakes an earlier write.
 */
export async function flushQueue(options: { retryRefused?: boolean } = {}): Promise<{ sent: number; left: number }> {
  if (!owner || offline()) return { sent: 0, left: (await readQueue()).length };
  return withQueueLock(async () => {
    let sent = 0;
    for (const item of await readQueue()) {
      if (refused(item) && !options.retryRefused) continue;
      const result = await postJson(item.url, item.body, item.id);
      if (result.ok) {
        sent += 1;
        await changeQueue((items) => items.filter((i) => i.id !== item.id));
        continue;
      }
      if (result.status === 0) break;
      const lastError = result.error.message || result.error.code;
      const lastFields = result.error.fields;
      await changeQueue((items) => items.map((i) => (i.id === item.id ? { ...i, lastStatus: result.status, lastError, lastFields } : i)));
      if (!refused({ ...item, lastStatus: result.status })) break;
    }
    return { sent, left: (await readQueue()).length };
  });
}

/**
 * Sends a floor write now, or keeps it for later when the phone has no connection. Any
 * answer from the server (created, 409, 422 …) is "sent" and shown to the person; only
 * no answer at all queues it. Writes already waiting go first, so order is kept.
 */
export async function submitFloorWrite<T>(url: string, body: unknown, label: string, form?: QueuedForm): Promise<FloorWriteResult<T>> {
  const item: QueuedWrite = { id: newIdempotencyKey(), url, body, label, createdAt: new Date().toISOString(), ...(form ? { form } : {}) };
  const queue = async (): Promise<FloorWriteResult<T>> => {
    await changeQueue((items) => [...items, item]);
    return { state: "queued", id: item.id };
  };
  // Without an owner (a page outside the floor layout) a queued write could never be shown or sent.
  if (!owner) return { state: "sent", result: await postJson<T>(url, body, item.id) };
  if (offline()) return queue();
  if ((await readQueue()).some((i) => !refused(i))) {
    await flushQueue();
    if ((await readQueue()).some((i) => !refused(i))) return queue();
  }
  const result = await postJson<T>(url, body, item.id);
  return unanswered(result.status) ? queue() : { state: "sent", result };
}

/** A waiting write of this person's, to open again in its form. */
export async function readQueuedWrite(id: string): Promise<QueuedWrite | null> {
  return (await readQueue()).find((i) => i.id === id) ?? null;
}

/**
 * Keeps what was typed on a refused write that was fixed and refused again (it stays in the
 * queue, to fix later), so leaving the form never loses it.
 */
export async function keepRefusedWrite(id: string, form: QueuedForm, body: unknown, lastError: string, lastFields?: Record<string, string[]>): Promise<void> {
  await changeQueue((items) => items.map((i) => (i.id === id ? { ...i, form, body, lastError, lastFields } : i)));
}

/** Drops a refused write the person has read and decided not to send (or has sent again, fixed). */
export async function discardQueuedWrite(id: string): Promise<void> {
  await changeQueue((items) => items.filter((i) => i.id !== id));
}

export function useQueuedWrites(): { items: QueuedSummary[]; flush: () => Promise<void> } {
  const [items, setItems] = useState<QueuedWrite[]>([]);
  useEffect(() => {
    let live = true;
    const refresh = () => void readQueue().then((list) => live && setItems(list));
    listeners.add(refresh);
    refresh();
    return () => {
      live = false;
      listeners.delete(refresh);
    };
  }, []);
  const flush = useCallback(async () => {
    await flushQueue({ retryRefused: true });
  }, []);
  const fixHref = (item: QueuedWrite) => (item.form && refused(item) ? `${item.form.href}${item.form.href.includes("?") ? "&" : "?"}queued=${encodeURIComponent(item.id)}` : undefined);
  return { items: items.map((item) => ({ id: item.id, label: item.label, createdAt: item.createdAt, lastError: item.lastError, fixHref: fixHref(item) })), flush };
}

/** Sends waiting writes on page load, when the phone comes back online, and every 30 s while any wait. */
export function useQueueAutoFlush(waiting: number): void {
  useEffect(() => {
    const flush = () => void flushQueue();
    flush();
    window.addEventListener("online", flush);
    return () => window.removeEventListener("online", flush);
  }, []);
  useEffect(() => {
    if (waiting === 0) return;
    const timer = window.setInterval(() => void flushQueue(), 30_000);
    return () => window.clearInterval(timer);
  }, [waiting]);
}
