import { describe, expect, it } from "vitest";
import { clientAddress, PEER_HEADER } from "./client-address";

const headers = (h: Record<string, string>) => new Headers(h);

describe("clientAddress", () => {
  it("without a trusted proxy: the socket's peer; X-Forwarded-For counts for nothing", () => {
    expect(clientAddress(headers({ [PEER_HEADER]: "198.51.100.7", "x-forwarded-for": "203.0.113.1" }), false)).toBe("198.51.100.7");
    expect(clientAddress(headers({ "x-forwarded-for": "203.0.113.1" }), false)).toBe("local");
  });

  it("behind a trusted proxy: the last X-Forwarded-For entry, whatever the client put before it", () => {
    // nginx's $proxy_add_x_forwarded_for appends the address it saw to what the client sent.
    expect(clientAddress(headers({ [PEER_HEADER]: "10.0.0.2", "x-forwarded-for": "203.0.113.1, 198.51.100.7" }), true)).toBe("198.51.100.7");
    expect(clientAddress(headers({ [PEER_HEADER]: "10.0.0.2" }), true)).toBe("10.0.0.2");
  });
});
