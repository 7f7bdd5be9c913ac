import { describe, expect, it } from "vitest";
import { ROLES } from "./roles";
import {
  HOME_FOR_ROLE,
  PERMISSIONS,
  ROLE_PERMISSIONS,
  can,
  canManageUsers,
  canReadFieldsOf,
  canReadLedgerOf,
  canSeeLot,
  canDispatchLot,
  canRecordOnField,
  type Actor,
} from "./permissions";

const actor = (role: Actor["role"], partyId = "p-1"): Actor => ({ id: "u", role, partyId });

describe("permission map", () => {
  it("gives every role a home of its own", () => {
    expect(new Set(ROLES.map((r) => HOME_FOR_ROLE[r])).size).toBe(ROLES.length);
  });

  it("only names known permissions", () => {
    for (const role of ROLES) {
      for (const p of ROLE_PERMISSIONS[role]) expect(PERMISSIONS).toContain(p);
    }
  });

  it("lets only admin manage users and parties", () => {
    const allowed = ROLES.filter((r) => canManageUsers(actor(r)));
    expect(allowed).toEqual(["admin"]);
    expect(ROLES.filter((r) => can(actor(r), "parties:manage"))).toEqual(["admin"]);
  });

  it("keeps the auditor read-only", () => {
    const writes = ROLE_PERMISSIONS.auditor.filter((p) => /^(write|record|manage)/.test(p.split(":")[1]!));
    expect(writes).toEqual([]);
    expect(can(actor("auditor"), "records:read-all")).toBe(true);
  });

  it("denies everything to no one signed in", () => {
    for (const p of PERMISSIONS) expect(can(null, p)).toBe(false);
  });
});

describe("ownership predicates", () => {
  it("lets a grower record only on their own fields", () => {
    expect(canRecordOnField(actor("grower", "g-1"), { growerId: "g-1" })).toBe(true);
    expect(canRecordOnField(actor("grower", "g-1"), { growerId: "g-2" })).toBe(false);
    expect(canRecordOnField(actor("admin", "b-1"), { growerId: "g-2" })).toBe(true);
    expect(canRecordOnField(actor("brewer", "b-1"), { growerId: "g-2" })).toBe(false);
    expect(canRecordOnField(actor("miller", "g-2"), { growerId: "g-2" })).toBe(false);
  });

  it("shows a grower only their own fields", () => {
    expect(canReadFieldsOf(actor("grower", "g-1"), "g-1")).toBe(true);
    expect(canReadFieldsOf(actor("grower", "g-1"), "g-2")).toBe(false);
    expect(canReadFieldsOf(actor("sales"), "g-2")).toBe(true);
  });

  it("lets a user see the lots their party holds or made, and the reading roles every lot", () => {
    const lot = { partyId: "m-1", originPartyId: "g-1" };
    expect(canSeeLot(actor("grower", "g-1"), lot)).toBe(true); // made it
    expect(canSeeLot(actor("miller", "m-1"), lot)).toBe(true); // holds it
    expect(canSeeLot(actor("grower", "g-2"), lot)).toBe(false);
    expect(canSeeLot(actor("miller", "m-2"), lot)).toBe(false);
    expect(canSeeLot(actor("auditor"), lot)).toBe(true);
    expect(canSeeLot(null, lot)).toBe(false);
  });

  it("shows a dispatched lot to the party it is addressed to, and to no other", () => {
    const sent = { partyId: "g-1", originPartyId: "g-1", inTransitTo: "m-1" };
    expect(canSeeLot(actor("miller", "m-1"), sent)).toBe(true);
    expect(canSeeLot(actor("miller", "m-2"), sent)).toBe(false);
    expect(canSeeLot(actor("miller", "m-1"), { ...sent, inTransitTo: null })).toBe(false);
  });

  it("lets the holder dispatch: a grower only its own harvest, mill and brewery staff their lots, the office any", () => {
    const harvest = { kind: "harvest", partyId: "g-1" };
    expect(canDispatchLot(actor("grower", "g-1"), harvest)).toBe(true);
    expect(canDispatchLot(actor("grower", "g-2"), harvest)).toBe(false);
    expect(canDispatchLot(actor("grower", "g-1"), { kind: "polished", partyId: "g-1" })).toBe(false);
    expect(canDispatchLot(actor("miller", "m-1"), harvest)).toBe(false); // not the holder
    expect(canDispatchLot(actor("miller", "m-1"), { kind: "polished", partyId: "m-1" })).toBe(true);
    expect(canDispatchLot(actor("admin", "b-1"), harvest)).toBe(true);
    for (const role of ["sales", "auditor"] as const) expect(canDispatchLot(actor(role, "g-1"), harvest)).toBe(false);
  });

  it("shows suppliers only their own ledger", () => {
    expect(canReadLedgerOf(actor("miller", "m-1"), "m-1")).toBe(true);
    expect(canReadLedgerOf(actor("miller", "m-1"), "g-1")).toBe(false);
    expect(canReadLedgerOf(actor("grower", "g-1"), "g-2")).toBe(false);
    expect(canReadLedgerOf(actor("admin"), "g-2")).toBe(true);
    expect(canReadLedgerOf(actor("sales"), "g-2")).toBe(false);
  });
});
