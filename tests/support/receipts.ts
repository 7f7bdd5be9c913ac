// A lot handed over as the ledger requires (issue 12: a receipt needs the sender's word): the
// holder's dispatch to the receiver, recorded by the office for the holder, then the receipt.
import { getSqlite } from "@/server/platform/db";
import { POST as postEvent } from "../../app/api/events/route";
import { call, jsonRequest } from "./api";

type Options = { to?: string; receipt?: Record<string, unknown>; slip?: string };

/** Dispatches the whole lot (its on-hand weight is the slip weight) and receives `quantity` of it as `receiver`. */
export async function dispatchAndReceive(office: string, receiver: string, code: string, quantity: number, options: Options = {}) {
  const lot = getSqlite().prepare("select party_id as holder, on_hand as onHand from lots where code = ?").get(code) as { holder: string; onHand: number };
  const body = { step: "shipping", partyId: lot.holder, inputs: [{ lot: code, quantity: lot.onHand }], counterpartyId: options.to ?? "mill-shirotae", referenceDoc: options.slip ?? `DS-${code}` };
  const sent = await call(postEvent, jsonRequest("/api/events", { cookie: office, body }));
  if (sent.status !== 201) throw new Error(`dispatch of ${code} failed: ${sent.status} ${JSON.stringify(sent.body)}`);
  return call(postEvent, jsonRequest("/api/events", { cookie: receiver, body: { step: "receiving", inputs: [{ lot: code, quantity }], ...options.receipt } }));
}
