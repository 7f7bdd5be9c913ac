// Payments to suppliers: one over the balance owed needs a confirming reason; a payment is put
// right by a reversal (never edited or deleted), once, by the office only. Append-only entries
// with a reason and the user are the house rule for records (DEVELOPERS.md); paying more than is
// owed only on purpose, and reversing rather than deleting, are common practice in accounts payable.
import Papa from "papaparse";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { GET as getLedger } from "../../app/api/suppliers/[partyId]/ledger/route";
import { POST as postReversal } from "../../app/api/suppliers/[partyId]/payments/[entryId]/reversal/route";
import { POST as postPayment } from "../../app/api/suppliers/[partyId]/payments/route";
import { GET as getStatementCsv } from "../../app/api/suppliers/[partyId]/statements/[number]/statement.csv/route";
import { POST as postStatement } from "../../app/api/suppliers/[partyId]/statements/route";
import { translator } from "@/i18n/messages";
import { getDb, getSqlite } from "@/server/platform/db";
import { accountRows } from "@/server/suppliers/supplier-describe";
import { ledgerOf } from "@/server/suppliers/supplier-ledger";
import { submit } from "../support/action-scope";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";

vi.mock("next/headers", async () => (await import("../support/action-scope")).nextHeaders);
vi.mock("next/cache", async () => (await import("../support/action-scope")).nextCache);
vi.mock("next-intl/server", async () => (await import("../support/action-scope")).nextIntlServer());

const cookies = {} as Record<"admin" | "brewer" | "grower" | "miller" | "sales" | "auditor", string>;
const today = () => new Date(Date.now() + 9 * 3_600_000).toISOString().slice(0, 10);
const yen = (v: number) => new Intl.NumberFormat("en-US").format(v);
const row = <T>(sql: string, ...args: unknown[]) => getSqlite().prepare(sql).get(...args) as T;

const ledger = async (partyId: string) => (await call(getLedger, jsonRequest(`/api/suppliers/${partyId}/ledger`, { cookie: cookies.admin }), { partyId })).body as { balanceYen: number; ageing: Record<string, number> };
const pay = (who: keyof typeof cookies, partyId: string, body: Record<string, unknown>) =>
  call(postPayment, jsonRequest(`/api/suppliers/${partyId}/payments`, { cookie: cookies[who], body: { date: today(), method: "bank-transfer", reference: "", ...body } }), { partyId });
const reverse = (who: keyof typeof cookies, partyId: string, entryId: string | number, body: unknown = { reason: "Sent to the wrong account" }) =>
  call(postReversal, jsonRequest(`/api/suppliers/${partyId}/payments/${entryId}/reversal`, { cookie: cookies[who], body }), { partyId, entryId: String(entryId) });
const statementCsv = async (partyId: string, number: string) => {
  const res = await getStatementCsv(jsonRequest(`/api/suppliers/${partyId}/statements/${number}/statement.csv`, { cookie: cookies.admin }), { params: Promise.resolve({ partyId, number }) });
  return Papa.parse<Record<string, string>>((await res.text()).replace(/^\uFEFF/, ""), { header: true, skipEmptyLines: true }).data;
};
const issue = async (partyId: string) => {
  const res = await call(postStatement, jsonRequest(`/api/suppliers/${partyId}/statements`, { cookie: cookies.admin, body: { from: today(), to: today() } }), { partyId });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body as { number: string; totals: { paymentsYen: number } };
};

beforeAll(async () => {
  for (const who of ["admin", "brewer", "grower", "miller", "sales", "auditor"] as const) cookies[who] = await signInAs(`${who}@example.com`);
});

describe("a payment over the balance owed", () => {
  it("is refused with 409 naming the balance, and changes nothing, without a confirming reason", async () => {
    const { balanceYen } = await ledger("grower-nakase");
    expect(balanceYen).toBeGreaterThan(0);
    const before = await tableDigests();
    const res = await pay("admin", "grower-nakase", { amountYen: balanceYen + 1 });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toBe(`The balance owed is ${yen(balanceYen)} yen; a payment of ${yen(balanceYen + 1)} yen is more. Give a reason to record it anyway.`);
    expect(res.body.error.fields.overpaymentReason).toHaveLength(1);
    // A blank or two-letter reason does not confirm it either.
    expect((await pay("admin", "grower-nakase", { amountYen: balanceYen + 1, overpaymentReason: "  ok " })).status).toBe(409);
    expect(await tableDigests()).toEqual(before);
  });

  it("stands with the reason, which is kept with the payment, in the audit log and on the statement CSV", async () => {
    const { balanceYen } = await ledger("grower-nakase");
    const reason = "Advance agreed for the 2027 seed rice";
    const res = await pay("admin", "grower-nakase", { amountYen: balanceYen + 50_000, reference: "TR-ADV-1", overpaymentReason: reason });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.balanceYen).toBe(-50_000);
    expect(row("select kind, amount_yen as amount, reason, json_extract(detail, '$.owedBeforeYen') as owed from supplier_entries where id = ?", res.body.id)).toEqual({ kind: "payment", amount: -(balanceYen + 50_000), reason, owed: balanceYen });
    const audit = row<{ action: string; subject: string; detail: string; userId: string }>("select action, subject, detail, user_id as userId from audit_log order by id desc limit 1");
    expect(audit).toMatchObject({ action: "payment.over-balance", subject: "grower-nakase" });
    expect(JSON.parse(audit.detail)).toEqual({ entryId: res.body.id, amountYen: balanceYen + 50_000, owedBeforeYen: balanceYen, reason });
    const { number } = await issue("grower-nakase");
    const line = (await statementCsv("grower-nakase", number)).find((r) => r.Entry === "Payment");
    expect(line?.Description).toBe(`Bank transfer, TR-ADV-1; paid over the balance owed of ${yen(balanceYen)} yen: ${reason}`);
  });

  it("up to the balance needs no reason", async () => {
    const { balanceYen } = await ledger("grower-ikeda");
    const res = await pay("admin", "grower-ikeda", { amountYen: balanceYen });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.balanceYen).toBe(0);
    expect(row("select reason from supplier_entries where id = ?", res.body.id)).toEqual({ reason: "" });
    expect((await pay("admin", "grower-ikeda", { amountYen: 1 })).status).toBe(409);
  });
});

describe("reversing a payment", () => {
  let paymentId = 0;
  let paid = 0;
  let before: Awaited<ReturnType<typeof ledger>>;

  it("appends a reversal of the opposite amount with the reason and the user, and restores the balance and its ageing", async () => {
    before = await ledger("mill-shirotae");
    paid = Math.min(before.balanceYen, 20_000);
    const res = await pay("admin", "mill-shirotae", { amountYen: paid, reference: "TR-77" });
    expect(res.status).toBe(201);
    paymentId = res.body.id;
    const undone = await reverse("admin", "mill-shirotae", paymentId, { reason: "Transfer bounced: wrong account number" });
    expect(undone.status, JSON.stringify(undone.body)).toBe(201);
    expect(undone.body.balanceYen).toBe(before.balanceYen);
    expect(row("select kind, amount_yen as amount, reverses_entry_id as reverses, reason, user_id as userId from supplier_entries where id = ?", undone.body.id)).toEqual({
      kind: "reversal", amount: paid, reverses: paymentId, reason: "Transfer bounced: wrong account number", userId: row<{ id: string }>("select id from users where email = 'admin@example.com'").id,
    });
    // The payment itself is untouched.
    expect(row("select amount_yen as amount from supplier_entries where id = ?", paymentId)).toEqual({ amount: -paid });
    // Dated when recorded, but never before the payment (dated noon on its day, which in the morning is still to come).
    const at = (id: number) => row<{ at: number }>("select at from supplier_entries where id = ?", id).at;
    expect(at(undone.body.id)).toBeGreaterThanOrEqual(Math.max(at(paymentId), Date.now() - 60_000));
    const after = await ledger("mill-shirotae");
    expect({ balanceYen: after.balanceYen, ageing: after.ageing }).toEqual({ balanceYen: before.balanceYen, ageing: before.ageing });
    expect(row<{ action: string }>("select action from audit_log order by id desc limit 1").action).toBe("payment.reversed");
    // The mill's own list of payments shows the reversal beside the payment.
    const lines = accountRows(ledgerOf(getDb(), "mill-shirotae"), (key, values) => translator("en")(key as never, values as never)).filter((r) => r.payment && /TR-77/.test(r.description));
    expect(lines.map((r) => [r.kind, r.amountYen])).toEqual([["payment", -paid], ["reversal", paid]]);
  });

  it("reverses a payment once: the second try is 409 and changes nothing", async () => {
    const was = await tableDigests();
    const again = await reverse("admin", "mill-shirotae", paymentId);
    expect(again.status).toBe(409);
    expect(again.body.error.message).toBe("This payment has already been reversed.");
    expect(await tableDigests()).toEqual(was);
  });

  it("reverses a payment already on an issued statement; the reversal lands on the next statement", async () => {
    const res = await pay("admin", "grower-coop", { amountYen: 1_000, reference: "TR-COOP", overpaymentReason: "Deposit on next season's contract" });
    expect(res.status).toBe(201);
    const first = await issue("grower-coop");
    expect(first.totals.paymentsYen).toBe(-1_000);
    expect((await reverse("admin", "grower-coop", res.body.id)).status).toBe(201);
    const next = await issue("grower-coop");
    expect(next.totals.paymentsYen).toBe(1_000);
    const lines = await statementCsv("grower-coop", next.number);
    expect(lines.find((r) => r.Entry === "Reversal")).toMatchObject({ Description: "Reverses the payment of TR-COOP: Sent to the wrong account", "Amount (JPY)": "1000" });
    expect((await statementCsv("grower-coop", first.number)).some((r) => r.Entry === "Reversal")).toBe(false);
  });

  it("answers a payment of another supplier, a delivery, an unknown id and a malformed one alike: 404, nothing changed", async () => {
    const other = await pay("admin", "grower-ikeda", { amountYen: 1, overpaymentReason: "Rounding agreed on the phone" });
    expect(other.status).toBe(201);
    const delivery = row<{ id: number }>("select id from supplier_entries where kind = 'delivery' and party_id = 'grower-nakase' limit 1").id;
    const was = await tableDigests();
    const answers = [];
    for (const id of [other.body.id, delivery, 99_999_999, "abc", "1e3", "-1"]) answers.push(await reverse("admin", "grower-nakase", id));
    expect(answers.map((a) => [a.status, a.body])).toEqual(answers.map(() => [404, { error: { code: "not_found", message: "That payment was not found." } }]));
    expect(await tableDigests()).toEqual(was);
    expect((await reverse("admin", "buyer-minato", other.body.id)).status).toBe(404);
  });

  it("needs a reason: 422 by the field, nothing changed", async () => {
    const was = await tableDigests();
    for (const body of [{}, { reason: "" }, { reason: " x " }, { reason: "r".repeat(501) }]) {
      const res = await reverse("admin", "grower-ikeda", row<{ id: number }>("select max(id) as id from supplier_entries where kind = 'payment' and party_id = 'grower-ikeda'").id, body);
      expect(res.status, JSON.stringify(body)).toBe(422);
      expect(Object.keys(res.body.error.fields)).toEqual(["reason"]);
    }
    expect(await tableDigests()).toEqual(was);
  });
});

describe("the wrong party", () => {
  it("grower, miller, brewer, sales and auditor may neither pay nor reverse: 403, nothing changed", async () => {
    const target = row<{ id: number }>("select max(id) as id from supplier_entries where kind = 'payment' and party_id = 'grower-ikeda'").id;
    const was = await tableDigests();
    for (const who of ["grower", "miller", "brewer", "sales", "auditor"] as const) {
      expect((await pay(who, "grower-ikeda", { amountYen: 1 })).status, who).toBe(403);
      expect((await reverse(who, "grower-ikeda", target)).status, who).toBe(403);
      // Their own account too: money moves only by the office's hand.
      expect((await reverse(who, "mill-shirotae", paymentIdOf("mill-shirotae"))).status, who).toBe(403);
    }
    expect(await tableDigests()).toEqual(was);
  });

  it("the office form's action: the office reverses, a grower is refused", async () => {
    const { reversePaymentAction } = await import("../../app/(office)/suppliers/[partyId]/actions");
    const target = row<{ id: number }>("select max(id) as id from supplier_entries where kind = 'payment' and party_id = 'grower-ikeda'").id;
    const was = await tableDigests();
    const refused = await submit(cookies.grower, reversePaymentAction, { partyId: "grower-ikeda", entryId: String(target), reversalReason: "Not mine to undo" });
    expect(refused).toEqual({ state: expect.objectContaining({ message: "Your role does not allow this." }) });
    expect(await tableDigests()).toEqual(was);
    const done = await submit(cookies.admin, reversePaymentAction, { partyId: "grower-ikeda", entryId: String(target), reversalReason: "Paid twice" });
    expect(done).toEqual({ state: expect.objectContaining({ ok: true }) });
    expect(row("select count(*) as n from supplier_entries where reverses_entry_id = ?", target)).toEqual({ n: 1 });
  });
});

function paymentIdOf(partyId: string): number {
  return row<{ id: number }>("select min(id) as id from supplier_entries where kind = 'payment' and party_id = ?", partyId).id;
}
