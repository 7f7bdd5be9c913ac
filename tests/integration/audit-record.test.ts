// The audit record: every kind of line the code can write has a summary in the catalogue, and the
// record of the demo season reads as sentences with names, codes and yen, never ids or JSON.
import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { EVENT_STEPS } from "@/db/schema";
import { loadMessages, translator } from "@/i18n/messages";
import { actionSummaryKey } from "@/server/records/audit-log-items";
import { auditRecord, renderAudit, sourceSummaryKeys, type AuditTranslate } from "@/server/records/audit-record";
import { recordAudit } from "@/server/records/audit";
import { getDb } from "@/server/platform/db";
import { changeUserRole, deactivateUser } from "@/server/accounts/user-admin";
import { DEMO_USERS } from "@/server/records/seed";
import type { SessionUser } from "@/server/accounts/session";

const actor = (id: string) => DEMO_USERS.find((u) => u.id === id)! as SessionUser;
const ROOT = path.resolve(import.meta.dirname, "../..");
const t = translator("en") as unknown as AuditTranslate;
const messages = loadMessages("en") as unknown as Record<string, unknown>;
const has = (key: string) => key.split(".").reduce<unknown>((node, part) => (node as Record<string, unknown> | undefined)?.[part], messages) !== undefined;

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    return statSync(full).isDirectory() ? sourceFiles(full) : /\.tsx?$/.test(name) && !name.endsWith(".test.ts") ? [full] : [];
  });
}

/** Every action the code can hand to recordAudit: the AuditAction union and each call's literal. */
function writtenActions(): string[] {
  const union = readFileSync(path.join(ROOT, "src/server/records/audit.ts"), "utf8").match(/export type AuditAction =([^;]+);/)![1]!;
  const found = new Set([...union.matchAll(/"([^"]+)"/g)].map((m) => m[1]!));
  for (const file of [...sourceFiles(path.join(ROOT, "src")), ...sourceFiles(path.join(ROOT, "app"))]) {
    for (const call of readFileSync(file, "utf8").matchAll(/recordAudit\([^;]*?action:\s*"([^"]+)"/gs)) found.add(call[1]!);
  }
  return [...found].sort();
}

describe("catalogue summaries", () => {
  it("has a summary for every audit action the code can write (hold, product and user actions included)", () => {
    const actions = writtenActions();
    // A floor the list must reach: the actions of sign-in, users, parties, settings, payments.
    expect(actions).toEqual(expect.arrayContaining(["user.signed-in", "user.deactivated", "user.role-changed", "party.updated", "settings.updated", "payment.reversed"]));
    const missing = actions.filter((a) => !has(`audit.${actionSummaryKey(a)}`));
    expect(missing, "audit actions without audit.actions.* in the catalogue").toEqual([]);
  });

  it("has a summary for every event step, supplier entry, contract, statement and receipt outcome", () => {
    const missing = [...sourceSummaryKeys().map((k) => `audit.${k}`), ...EVENT_STEPS.map((s) => `steps.${s}`)].filter((k) => !has(k));
    expect(missing).toEqual([]);
  });
});

describe("the record of the demo season", () => {
  let rows: ReturnType<typeof renderAudit>;
  beforeAll(() => {
    deactivateUser(actor("user-admin"), "user-grower2", t as never);
    changeUserRole(actor("user-admin"), "user-sales", "brewer", t as never);
    getDb().transaction((tx) => recordAudit(tx, { userId: "user-admin", action: "party.updated", subject: "grower-ikeda", detail: { before: { phone: "0860-00-0000" }, after: { phone: "0860-11-1111" } } }));
    rows = renderAudit(auditRecord(5000), t);
  });

  it("holds events, money, statements and master data side by side, newest first", () => {
    const text = rows.map((r) => r.summary);
    expect(text.some((s) => /^Polishing run by Shirotae Polishing Works: H26-\d{4} \(.+ kg\) → P26-\d{4}/.test(s)), "a polishing event with its lots").toBe(true);
    expect(text.some((s) => /^Paid .+ ¥[\d,]+ \(reference/.test(s)), "a payment in yen").toBe(true);
    expect(text.some((s) => /^Issued statement S-2025-0001 to Ikeda Farm/.test(s)), "the seeded statement").toBe(true);
    expect(text).toContain("Deactivated Nakase Emi; their sessions ended");
    expect(text).toContain("Changed the role of Hayashi Aoi from Sales to Brewer; their sessions ended");
    expect(text).toContain("Updated the party Ikeda Farm: phone: 0860-00-0000 → 0860-11-1111");
    const times = rows.map((r) => r.at.getTime());
    expect(times).toEqual([...times].sort((a, b) => b - a));
  });

  it("names people, parties and lots, never an id, a catalogue key or JSON", () => {
    const ids = getDb().$client.prepare("select id from users union select id from parties union select id from fields").pluck().all() as string[];
    for (const row of rows) {
      expect(row.summary, row.id).not.toMatch(/[{}"[\]]|^audit\.|\baudit\.(actions|summaries)\b/);
      for (const id of ids) expect(row.summary, `${row.id} names the id ${id}`).not.toContain(id);
      expect(row.userName).not.toMatch(/^user-/);
    }
    expect(rows.some((r) => r.summary === t("audit.unknownAction"))).toBe(false);
  });
});
