/**
 * The Content-Security-Policy for pages, with a fresh nonce per request (set by proxy.ts; Next reads
 * the nonce from the request's CSP header and puts it on its own inline scripts). Scripts run only
 * from this origin with the nonce ('strict-dynamic' lets them load Next's chunks); nothing may frame
 * the app; forms post only here.
 * Styles allow 'unsafe-inline' because React style attributes (bar widths, chart sizes) are inline
 * styles; a style cannot run script, so this is the usual trade-off.
 */
export function buildContentSecurityPolicy(nonce: string, options: { development: boolean; https: boolean }): string {
  const directives = [
    "default-src 'self'",
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${options.development ? " 'unsafe-eval'" : ""}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' blob: data:",
    "font-src 'self'",
    `connect-src 'self'${options.development ? " ws: wss:" : ""}`,
    // The session form's service worker (public/sw.js). Without this it falls back to script-src, whose
    // 'strict-dynamic' ignores 'self', so the registration would be refused.
    "worker-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
    // Only over https: on plain http (a lab laptop, the test server) it would break every asset.
    ...(options.https ? ["upgrade-insecure-requests"] : []),
  ];
  return directives.join("; ");
}

/** A nonce: 128 random bits, base64. */
export function createNonce(): string {
  return Buffer.from(crypto.randomUUID()).toString("base64");
}

/** HSTS for a year, sent only on responses served over https. */
export const STRICT_TRANSPORT_SECURITY = "max-age=31536000; includeSubDomains";

/** Whether the visitor reached us over https, directly or through a TLS-terminating reverse proxy. */
export function isHttps(url: URL, forwardedProto: string | null): boolean {
  return url.protocol === "https:" || forwardedProto?.split(",")[0]?.trim().toLowerCase() === "https";
}
