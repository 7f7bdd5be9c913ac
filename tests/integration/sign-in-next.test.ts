// Signing in from a label's address comes back to it; anything but a path on this site is
// ignored, so our sign-in page cannot be used to send someone elsewhere (OWASP "Unvalidated
// Redirects and Forwards" cheat sheet). The action is called as a form post, with its redirect.
import { describe, expect, it, vi } from "vitest";
import { PEER_HEADER } from "@/server/platform/client-address";
import { signInAction } from "../../app/(auth)/sign-in/actions";
import { submit } from "../support/action-scope";

vi.mock("next/headers", async () => (await import("../support/action-scope")).nextHeaders);
vi.mock("next/cache", async () => (await import("../support/action-scope")).nextCache);
vi.mock("next-intl/server", async () => (await import("../support/action-scope")).nextIntlServer());

// A documentation address (RFC 5737), so no throttle row is shared with other files.
const CLIENT = { [PEER_HEADER]: "203.0.113.44" };
const brewer = (next?: string) => submit("", signInAction, { email: "brewer@example.com", password: "grainline-demo", ...(next === undefined ? {} : { next }) }, CLIENT);

describe("sign-in with a next path", () => {
  it("goes back to a path on this site, such as the label route", async () => {
    expect(await brewer("/l/P26-0001")).toEqual({ redirect: "/l/P26-0001" });
  });

  it("goes home (the brewer's /scan) for an absolute, protocol-relative or backslash address", async () => {
    for (const next of ["https://evil.example/l/P26-0001", "//evil.example/l/P26-0001", "/\\evil.example", "javascript:alert(1)"]) {
      expect(await brewer(next), next).toEqual({ redirect: "/scan" });
    }
  });

  it("goes home without a next, as before", async () => {
    expect(await brewer()).toEqual({ redirect: "/scan" });
  });

  it("keeps a wrong password a wrong password, whatever the next", async () => {
    const answer = await submit("", signInAction, { email: "brewer@example.com", password: "not-it", next: "/l/P26-0001" }, CLIENT);
    expect(answer).toEqual({ state: { message: "The e-mail or password is not right.", values: { email: "brewer@example.com" } } });
  });
});
