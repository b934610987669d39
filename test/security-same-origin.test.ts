/** The cross-site rule for JSON route handlers (lib/auth/same-origin.ts), header by header. */
import { describe, expect, it } from "vitest";
import { checkSameOrigin } from "../lib/auth/same-origin";

const SESSION = "next-auth.session-token=abc";
const at = (h: Record<string, string>) => checkSameOrigin(new Headers({ host: "lab.example:3000", ...h }));

describe("checkSameOrigin", () => {
  it("lets a same-origin browser request through", () => {
    expect(at({ origin: "http://lab.example:3000", "sec-fetch-site": "same-origin", cookie: SESSION })).toEqual({ ok: true });
    expect(at({ origin: "https://LAB.example:3000" })).toEqual({ ok: true });
  });

  it("refuses a foreign, malformed or null Origin with a clear message", () => {
    for (const origin of ["https://evil.example", "http://lab.example:3001", "null", "not a url", "http://lab.example.evil.example:3000"]) {
      const verdict = at({ origin, cookie: SESSION });
      expect(verdict.ok, origin).toBe(false);
      if (!verdict.ok) expect(verdict.message).toMatch(/came from another site/);
    }
  });

  it("checks the forwarded host when a reverse proxy sets one", () => {
    expect(checkSameOrigin(new Headers({ host: "127.0.0.1:3000", "x-forwarded-host": "lab.example", origin: "https://lab.example" })).ok).toBe(true);
    expect(checkSameOrigin(new Headers({ host: "lab.example", "x-forwarded-host": "other.example", origin: "https://lab.example" })).ok).toBe(false);
  });

  it("refuses cross-site and same-site fetches without an Origin, but allows a top-level link", () => {
    expect(at({ "sec-fetch-site": "cross-site", "sec-fetch-mode": "cors" }).ok).toBe(false);
    expect(at({ "sec-fetch-site": "same-site", "sec-fetch-mode": "no-cors", cookie: SESSION }).ok).toBe(false);
    expect(at({ "sec-fetch-site": "cross-site", "sec-fetch-mode": "navigate", "content-type": "text/plain" }).ok).toBe(false);
    expect(at({ "sec-fetch-site": "cross-site", "sec-fetch-mode": "navigate", cookie: SESSION }).ok).toBe(true);
    expect(at({ "sec-fetch-site": "none", "sec-fetch-mode": "navigate" }).ok).toBe(true);
    expect(at({ "sec-fetch-site": "same-origin", "sec-fetch-mode": "cors" }).ok).toBe(true);
  });

  it("lets a non-browser client through, but not a signed-in form-shaped body without Origin", () => {
    expect(at({}).ok).toBe(true);
    expect(at({ "content-type": "text/plain" }).ok).toBe(true);
    expect(at({ cookie: SESSION, "content-type": "application/json" }).ok).toBe(true);
    for (const type of ["text/plain;charset=UTF-8", "application/x-www-form-urlencoded", "multipart/form-data; boundary=x"]) {
      expect(at({ cookie: `a=1; ${SESSION}`, "content-type": type }).ok, type).toBe(false);
      expect(at({ cookie: `__Secure-next-auth.session-token.0=x`, "content-type": type }).ok, type).toBe(false);
    }
  });
});
