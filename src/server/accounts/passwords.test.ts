import { describe, expect, it } from "vitest";
import { hashPassword, verifyPassword } from "./passwords";

describe("argon2id password hashes", () => {
  it("round-trips a password and refuses another", async () => {
    const hash = await hashPassword("correct horse battery staple");
    // PHC string format (RFC 9106 names argon2id the recommended variant).
    expect(hash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
    expect(await verifyPassword(hash, "correct horse battery staple")).toBe(true);
    expect(await verifyPassword(hash, "correct horse battery stapler")).toBe(false);
  });

  it("salts every hash", async () => {
    expect(await hashPassword("same")).not.toBe(await hashPassword("same"));
  });

  it("treats a damaged hash as a failed check, not a crash", async () => {
    expect(await verifyPassword("not-a-hash", "x")).toBe(false);
  });
});
