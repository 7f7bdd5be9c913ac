// Deactivating, reactivating and changing the role of a user from the admin's users page: sessions
// end at once, a deactivated user's sign-in reads exactly like a wrong password, the last active
// admin stays, and only the admin may do any of it.
import { eq } from "drizzle-orm";
import { describe, expect, it, vi } from "vitest";
import { POST as signInRoute } from "../../app/api/auth/sign-in/route";
import { GET as meRoute } from "../../app/api/me/route";
import { changeRoleAction, deactivateUserAction, reactivateUserAction } from "../../app/(office)/admin/users/actions";
import { auditLog, users } from "@/db/schema";
import { getDb } from "@/server/platform/db";
import type { FormState } from "@/lib/form-state";
import { submit } from "../support/action-scope";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";

vi.mock("next/headers", async () => (await import("../support/action-scope")).nextHeaders);
vi.mock("next/cache", async () => (await import("../support/action-scope")).nextCache);
vi.mock("next-intl/server", async () => (await import("../support/action-scope")).nextIntlServer());

const me = async (cookie: string) => (await call(meRoute, jsonRequest("/api/me", { cookie }))).status;
const signIn = (email: string, password: string) => call(signInRoute, jsonRequest("/api/auth/sign-in", { body: { email, password }, headers: { "x-grainline-peer": `10.9.0.${email.length}` } }));
function stateOf(r: Awaited<ReturnType<typeof submit>>): FormState {
  if (!("state" in r)) throw new Error(`redirected to ${r.redirect}`);
  return r.state;
}
const lastAudit = () => getDb().select().from(auditLog).orderBy(auditLog.id).all().at(-1)!;

describe("deactivating and reactivating a user", () => {
  it("ends the user's sessions at once, refuses their sign-in as a wrong password would, and reactivation lets them in again", async () => {
    const admin = await signInAs("admin@example.com");
    const grower2 = await signInAs("grower2@example.com");
    expect(await me(grower2)).toBe(200);

    const done = stateOf(await submit(admin, deactivateUserAction, { userId: "user-grower2" }));
    expect(done).toMatchObject({ ok: true });
    expect(await me(grower2)).toBe(401);
    expect(lastAudit()).toMatchObject({ action: "user.deactivated", subject: "user-grower2", userId: "user-admin" });

    // The right password of a deactivated user and a wrong one of an active user: the same answer.
    const refused = await signIn("grower2@example.com", "grainline-demo");
    const wrong = await signIn("miller@example.com", "not the password");
    expect(refused.status).toBe(401);
    expect(refused.body).toEqual(wrong.body);

    expect(stateOf(await submit(admin, reactivateUserAction, { userId: "user-grower2" }))).toMatchObject({ ok: true });
    expect(lastAudit()).toMatchObject({ action: "user.reactivated", subject: "user-grower2" });
    expect((await signIn("grower2@example.com", "grainline-demo")).status).toBe(200);
  });

  it("refuses every role but the admin, and an unknown user answers as not found, changing nothing", async () => {
    const before = await tableDigests(["sessions", "audit_log"]);
    for (const email of ["brewer@example.com", "auditor@example.com", "grower@example.com"]) {
      const cookie = await signInAs(email);
      for (const [action, form] of [[deactivateUserAction, { userId: "user-miller" }], [reactivateUserAction, { userId: "user-miller" }], [changeRoleAction, { userId: "user-sales", role: "admin" }]] as const) {
        expect(stateOf(await submit(cookie, action, form)).message, email).toBe("Your role does not allow this.");
      }
    }
    const admin = await signInAs("admin@example.com");
    expect(stateOf(await submit(admin, deactivateUserAction, { userId: "user-nobody" })).message).toBe("That record was not found.");
    expect(await tableDigests(["sessions", "audit_log"])).toEqual(before);
  });
});

describe("changing a role", () => {
  it("changes it, records from and to, and ends that user's sessions", async () => {
    const admin = await signInAs("admin@example.com");
    const sales = await signInAs("sales@example.com");
    expect(stateOf(await submit(admin, changeRoleAction, { userId: "user-sales", role: "brewer" }))).toMatchObject({ ok: true, message: "Hayashi Aoi is now Brewer, and signs in again under it." });
    expect(await me(sales)).toBe(401);
    expect(getDb().select({ role: users.role }).from(users).where(eq(users.id, "user-sales")).get()!.role).toBe("brewer");
    expect(lastAudit()).toMatchObject({ action: "user.role-changed", subject: "user-sales" });
    expect(JSON.parse(lastAudit().detail)).toEqual({ from: "sales", to: "brewer" });
  });

  it("refuses a role that does not fit the user's party (PARTY_KIND_FOR_ROLE): a brewery user cannot become a grower", async () => {
    const admin = await signInAs("admin@example.com");
    const before = await tableDigests();
    const state = stateOf(await submit(admin, changeRoleAction, { userId: "user-auditor", role: "grower" }));
    expect(state.fields?.role?.[0]).toBe("This role belongs to a party of kind Grower.");
    expect(await tableDigests()).toEqual(before);
  });
});

describe("the last active admin", () => {
  it("cannot deactivate or demote themselves; once another admin is active, they can", async () => {
    const admin = await signInAs("admin@example.com");
    const before = await tableDigests();
    const off = stateOf(await submit(admin, deactivateUserAction, { userId: "user-admin" }));
    expect(off.message).toBe("This clashes with what is already recorded.");
    expect(off.fields?.userId?.[0]).toMatch(/^The last active office admin cannot be deactivated/);
    const demoted = stateOf(await submit(admin, changeRoleAction, { userId: "user-admin", role: "brewer" }));
    expect(demoted.fields?.role?.[0]).toMatch(/^The last active office admin/);
    expect(await tableDigests()).toEqual(before);

    expect(stateOf(await submit(admin, changeRoleAction, { userId: "user-auditor", role: "admin" }))).toMatchObject({ ok: true });
    expect(stateOf(await submit(admin, changeRoleAction, { userId: "user-admin", role: "brewer" }))).toMatchObject({ ok: true });
    expect(await me(admin)).toBe(401);
  });
});
