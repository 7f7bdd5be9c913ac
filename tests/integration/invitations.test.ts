import { desc } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { POST as inviteRoute } from "../../app/api/users/route";
import { outbox, passwordTokens } from "@/db/schema";
import { getDb } from "@/server/platform/db";
import { setPasswordWithToken } from "@/server/accounts/users";
import { call, jsonRequest, signInAs, tableDigests } from "../support/api";

const t = (key: string) => key;

function latestMail() {
  return getDb().select().from(outbox).orderBy(desc(outbox.createdAt)).get()!;
}

describe("inviting a user", () => {
  it("writes the invitation to the outbox, stores only the token's hash, and the link sets a password once", async () => {
    const cookie = await signInAs("admin@example.com");
    const res = await call(inviteRoute, jsonRequest("/api/users", { cookie, body: { name: "Sato Mei", email: "Mei@Example.com", role: "brewer", partyId: "brewery-kirinoha" } }));
    expect(res.status).toBe(201);

    const mail = latestMail();
    expect(mail.toAddress).toBe("mei@example.com");
    expect(mail.transport).toBe("local");
    const token = /\/set-password\/([A-Za-z0-9_-]+)/.exec(mail.textBody)?.[1];
    expect(token).toBeDefined();
    const stored = getDb().select().from(passwordTokens).all();
    expect(stored.some((row) => row.tokenHash === token)).toBe(false);

    await setPasswordWithToken(token!, "a long new password", "local", t);
    expect(await signInAs("mei@example.com", "a long new password")).toMatch(/^grainline_session=/);

    await expect(setPasswordWithToken(token!, "another password!!", "local", t)).rejects.toMatchObject({ code: "invalid" });
  });

  it("refuses a second user with the same e-mail (409) and a role that does not fit the party (422)", async () => {
    const cookie = await signInAs("admin@example.com");
    const before = await tableDigests();
    const dup = await call(inviteRoute, jsonRequest("/api/users", { cookie, body: { name: "Again", email: "grower@example.com", role: "grower", partyId: "grower-ikeda" } }));
    expect(dup.status).toBe(409);
    expect(dup.body.error.fields.email).toBeDefined();
    const misfit = await call(inviteRoute, jsonRequest("/api/users", { cookie, body: { name: "Wrong", email: "wrong@example.com", role: "miller", partyId: "grower-ikeda" } }));
    expect(misfit.status).toBe(422);
    expect(misfit.body.error.fields.role).toBeDefined();
    const badRole = await call(inviteRoute, jsonRequest("/api/users", { cookie, body: { name: "Wrong", email: "wrong@example.com", role: "owner", partyId: "grower-ikeda" } }));
    expect(badRole.status).toBe(422);
    expect(await tableDigests()).toEqual(before);
  });
});
