/**
 * Cross-site request refusal for the JSON route handlers (server actions get Next's own Origin-vs-Host
 * check). Works from the request headers alone, so guardRoute can apply it without being told the method:
 *
 * 1. An Origin header (every current browser sends one on any POST/PUT/PATCH/DELETE and on every
 *    cross-origin fetch) must name this host (X-Forwarded-Host, else Host). "null" is refused.
 * 2. Without Origin, a Sec-Fetch-Site of "cross-site" or "same-site" is refused unless the request is a
 *    plain top-level navigation (Sec-Fetch-Mode: navigate, e.g. following a link to an export; such GETs
 *    carry no Origin and change nothing). "same-origin" and "none" (typed address, bookmark) pass.
 * 3. With neither header the caller is not a current browser (curl, a script, the test runner). It may
 *    go on, unless it carries a session cookie and a body type an HTML form can send (form-urlencoded,
 *    multipart, text/plain): that is what a cross-site form in an old browser would look like, so a
 *    cookie-carrying write without Origin must be JSON, which no page on another site can send here
 *    without a CORS preflight this app never approves.
 * next-auth's SameSite=Lax session cookie is the second line behind all three.
 */
export type SameOriginVerdict = { ok: true } | { ok: false; message: string };

const SESSION_COOKIE = /(^|;\s*)(__Secure-)?next-auth\.session-token(\.\d+)?=/;
const FORM_BODY = /^(application\/x-www-form-urlencoded|multipart\/form-data|text\/plain)\b/i;

export const CROSS_SITE_MESSAGE = "Refused: this request came from another site. Use Coilyard's own pages, or call the API without a browser.";

function expectedHost(headers: Headers): string | null {
  const forwarded = headers.get("x-forwarded-host")?.split(",")[0]?.trim();
  return (forwarded || headers.get("host") || "").toLowerCase() || null;
}

function hostOf(origin: string): string | null {
  try {
    return new URL(origin).host.toLowerCase();
  } catch {
    return null;
  }
}

export function checkSameOrigin(headers: Headers): SameOriginVerdict {
  const origin = headers.get("origin");
  if (origin !== null) {
    const host = expectedHost(headers);
    if (host && hostOf(origin) === host) return { ok: true };
    return { ok: false, message: `${CROSS_SITE_MESSAGE} (Origin ${origin} is not ${host ?? "this host"}.)` };
  }
  const site = headers.get("sec-fetch-site")?.toLowerCase();
  if (site !== undefined) {
    if (site === "same-origin" || site === "none") return { ok: true };
    if (headers.get("sec-fetch-mode")?.toLowerCase() === "navigate" && !headers.get("content-type")) return { ok: true };
    return { ok: false, message: `${CROSS_SITE_MESSAGE} (Sec-Fetch-Site: ${site}.)` };
  }
  const hasSession = SESSION_COOKIE.test(headers.get("cookie") ?? "");
  if (hasSession && FORM_BODY.test(headers.get("content-type") ?? "")) {
    return { ok: false, message: `${CROSS_SITE_MESSAGE} (A signed-in request without an Origin header must send JSON.)` };
  }
  return { ok: true };
}
