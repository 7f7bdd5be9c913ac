import { describe, expect, it } from "vitest";
import { isPhoneRequest } from "./device";

const headers = (h: Record<string, string>) => new Headers(h);
// User-Agent strings as the browsers publish them (MDN "User-Agent" reference examples), from memory.
const IPHONE = "Mozilla/5.0 (iPhone; CPU iPhone OS 17_5 like Mac OS X) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/17.5 Mobile/15E148 Safari/604.1";
const ANDROID_FIREFOX = "Mozilla/5.0 (Android 14; Mobile; rv:126.0) Gecko/126.0 Firefox/126.0";
const DESKTOP = "Mozilla/5.0 (X11; Linux x86_64) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/126.0.0.0 Safari/537.36";
const IPAD = "Mozilla/5.0 (Macintosh; Intel Mac OS X 10_15_7) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/17.5 Safari/605.1.15";

describe("isPhoneRequest", () => {
  it("trusts the Sec-CH-UA-Mobile client hint when a Chromium browser sends it (?1 phone, ?0 not)", () => {
    expect(isPhoneRequest(headers({ "sec-ch-ua-mobile": "?1", "user-agent": DESKTOP }))).toBe(true);
    expect(isPhoneRequest(headers({ "sec-ch-ua-mobile": "?0", "user-agent": IPHONE }))).toBe(false);
  });

  it("falls back to 'Mobi' in the User-Agent (MDN's advice) for Safari and Firefox", () => {
    expect(isPhoneRequest(headers({ "user-agent": IPHONE }))).toBe(true);
    expect(isPhoneRequest(headers({ "user-agent": ANDROID_FIREFOX }))).toBe(true);
    expect(isPhoneRequest(headers({ "user-agent": DESKTOP }))).toBe(false);
    // iPadOS Safari presents itself as a Mac: a tablet gets the desk page.
    expect(isPhoneRequest(headers({ "user-agent": IPAD }))).toBe(false);
    expect(isPhoneRequest(headers({}))).toBe(false);
  });
});
