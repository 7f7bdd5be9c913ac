import { describe, expect, it } from "vitest";
import { safeNextPath, signInPath } from "./safe-next";

describe("safeNextPath", () => {
  it("keeps a path on this site, with its query", () => {
    expect(safeNextPath("/l/P26-0003")).toBe("/l/P26-0003");
    expect(safeNextPath("/scan?code=P26-0003")).toBe("/scan?code=P26-0003");
  });

  it("ignores absolute URLs and other schemes (OWASP Unvalidated Redirects cheat sheet)", () => {
    for (const raw of ["https://evil.example/", "http://localhost:3000/lots/P26-0001", "javascript:alert(1)", "data:text/html,x", "evil.example", "l/P26-0003"]) {
      expect(safeNextPath(raw), raw).toBeNull();
    }
  });

  it("ignores protocol-relative and backslash forms that browsers resolve to another host (WHATWG URL)", () => {
    for (const raw of ["//evil.example", "//evil.example/l/P26-0003", "/\\evil.example", "\\\\evil.example", "/\t/evil.example", "/\n/evil.example"]) {
      expect(safeNextPath(raw), JSON.stringify(raw)).toBeNull();
      // The independent check: the browser's own URL parser would leave our origin with each.
      if (raw.startsWith("/")) expect(new URL(raw, "https://grainline.example").origin).not.toBe("https://grainline.example");
    }
  });

  it("ignores the sign-in and sign-out pages themselves, blanks, non-strings and very long values", () => {
    expect(safeNextPath("/sign-in?next=/x")).toBeNull();
    expect(safeNextPath("/sign-out")).toBeNull();
    expect(safeNextPath("")).toBeNull();
    expect(safeNextPath(undefined)).toBeNull();
    expect(safeNextPath(["/x"])).toBeNull();
    expect(safeNextPath(`/${"a".repeat(600)}`)).toBeNull();
  });

  it("normalises dot segments, so /../ cannot climb out of the path (RFC 3986 §5.2.4)", () => {
    expect(safeNextPath("/lots/../admin/users")).toBe("/admin/users");
  });
});

describe("signInPath", () => {
  it("carries a safe destination and drops an unsafe one", () => {
    expect(signInPath("/l/P26-0003")).toBe("/sign-in?next=%2Fl%2FP26-0003");
    expect(signInPath("//evil.example")).toBe("/sign-in");
  });
});
