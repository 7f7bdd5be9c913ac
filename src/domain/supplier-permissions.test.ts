import { describe, expect, it } from "vitest";
import { can, canReadLedgerOf, type Actor } from "./permissions";
import { ROLES } from "./roles";

// Issue 6: growers and millers read only their own account; the office any; the auditor reads, never writes.
const actor = (role: Actor["role"], partyId = "p-1"): Actor => ({ id: "u", role, partyId });

describe("who reads and keeps the supplier ledger", () => {
  it("lets the office and the auditor read every supplier's account, and no one else", () => {
    expect(ROLES.filter((r) => can(actor(r), "ledger:read-all"))).toEqual(["admin", "auditor"]);
    expect(canReadLedgerOf(actor("auditor", "brewery"), "grower-1")).toBe(true);
    expect(canReadLedgerOf(actor("sales", "brewery"), "grower-1")).toBe(false);
    expect(canReadLedgerOf(actor("brewer", "brewery"), "grower-1")).toBe(false);
  });

  it("lets only the office record payments, adjustments, contracts and statements", () => {
    expect(ROLES.filter((r) => can(actor(r), "ledger:manage"))).toEqual(["admin"]);
  });

  it("lets a grower or a mill read its own account only", () => {
    expect(canReadLedgerOf(actor("grower", "g-1"), "g-1")).toBe(true);
    expect(canReadLedgerOf(actor("grower", "g-1"), "g-2")).toBe(false);
    expect(canReadLedgerOf(actor("miller", "m-1"), "g-1")).toBe(false);
  });
});
