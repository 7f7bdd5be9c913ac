import { describe, expect, it } from "vitest";
import { canCorrect, correctionRefusal, isOfficeOf } from "./corrections";
import type { Actor } from "./permissions";

// The demo parties of src/server/records/seed.ts, with one user each.
const grower: Actor = { id: "u-grower", role: "grower", partyId: "grower-ikeda" };
const otherGrower: Actor = { id: "u-grower2", role: "grower", partyId: "grower-nakase" };
const miller: Actor = { id: "u-miller", role: "miller", partyId: "mill-shirotae" };
const brewer: Actor = { id: "u-brewer", role: "brewer", partyId: "brewery-kirinoha" };
const admin: Actor = { id: "u-admin", role: "admin", partyId: "brewery-kirinoha" };
const auditor: Actor = { id: "u-auditor", role: "auditor", partyId: "brewery-kirinoha" };

/** A harvest registered by the grower. */
const harvested = { userId: "u-grower", partyId: "grower-ikeda" };
/** A polishing run the mill recorded. */
const polishing = { userId: "u-miller", partyId: "mill-shirotae" };

describe("the office of a party", () => {
  it("is the admin for the brewery, and a grower's or a mill's own staff for theirs", () => {
    expect(isOfficeOf(admin, "brewery-kirinoha")).toBe(true);
    expect(isOfficeOf(brewer, "brewery-kirinoha")).toBe(false);
    expect(isOfficeOf(auditor, "brewery-kirinoha")).toBe(false);
    expect(isOfficeOf(miller, "mill-shirotae")).toBe(true);
    expect(isOfficeOf(grower, "grower-ikeda")).toBe(true);
    expect(isOfficeOf(grower, "grower-nakase")).toBe(false);
    expect(isOfficeOf(null, "grower-ikeda")).toBe(false);
  });
});

describe("who may correct an event", () => {
  it("before a hand-over: the person who recorded it, or the brewery office", () => {
    expect(correctionRefusal(grower, harvested, ["grower-ikeda"])).toBeNull();
    expect(correctionRefusal(admin, harvested, ["grower-ikeda"])).toBeNull();
    expect(correctionRefusal(otherGrower, harvested, ["grower-ikeda"])).toBe("errors.notYourEvent");
    expect(correctionRefusal(miller, harvested, ["grower-ikeda"])).toBe("errors.notYourEvent");
  });

  it("after the mill took the harvest in: the mill or the brewery office, never the grower", () => {
    expect(correctionRefusal(grower, harvested, ["mill-shirotae"])).toBe("errors.movedOnSinceEvent");
    expect(correctionRefusal(miller, harvested, ["mill-shirotae"])).toBeNull();
    expect(correctionRefusal(admin, harvested, ["mill-shirotae"])).toBeNull();
    expect(correctionRefusal(otherGrower, harvested, ["mill-shirotae"])).toBe("errors.movedOnSinceEvent");
  });

  it("after the brewery took the polished rice in: only the brewery office, not its floor staff", () => {
    // The bran stayed at the mill, the polished rice went on: the office of both holders.
    expect(correctionRefusal(miller, polishing, ["mill-shirotae", "brewery-kirinoha"])).toBe("errors.movedOnSinceEvent");
    expect(correctionRefusal(brewer, polishing, ["mill-shirotae", "brewery-kirinoha"])).toBe("errors.movedOnSinceEvent");
    expect(canCorrect(admin, polishing, ["mill-shirotae", "brewery-kirinoha"])).toBe(true);
  });

  it("an event with no lot: its recorder", () => {
    expect(canCorrect(miller, polishing, [])).toBe(true);
    expect(canCorrect(grower, polishing, [])).toBe(false);
  });

  it("nobody signed in: never", () => {
    expect(canCorrect(null, harvested, ["grower-ikeda"])).toBe(false);
  });
});
