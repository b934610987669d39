/**
 * Sends anonymous visitors to the sign-in page. A convenience only: every page, action and route
 * handler checks the session and role itself (lib/auth/session.ts). API routes are not redirected;
 * they answer 401 themselves.
 * Also sets each page's Content-Security-Policy with a per-request nonce (Next puts the nonce on its
 * inline scripts) and, over https only, Strict-Transport-Security.
 */
import { NextResponse, type NextRequest } from "next/server";
import { appEnv } from "@/lib/config/env";
import { decodeSessionUserId, sessionTokenFrom } from "@/lib/auth/session-token";
import { buildContentSecurityPolicy, createNonce, isHttps, STRICT_TRANSPORT_SECURITY } from "@/lib/auth/content-security-policy";

export async function proxy(request: NextRequest) {
  const https = isHttps(request.nextUrl, request.headers.get("x-forwarded-proto"));
  const isSignIn = request.nextUrl.pathname === "/sign-in" || request.nextUrl.pathname.startsWith("/sign-in/");
  // The same cookie and decode as the pages (lib/auth/session-token.ts), so the two never disagree about a token.
  const userId = isSignIn ? null : await decodeSessionUserId(sessionTokenFrom(request.cookies.getAll()), appEnv().NEXTAUTH_SECRET);
  if (!isSignIn && !userId) {
    const signIn = new URL("/sign-in", request.url);
    const target = request.nextUrl.pathname + request.nextUrl.search;
    if (target !== "/") signIn.searchParams.set("callbackUrl", target);
    const redirect = NextResponse.redirect(signIn);
    if (https) redirect.headers.set("Strict-Transport-Security", STRICT_TRANSPORT_SECURITY);
    return redirect;
  }
  const nonce = createNonce();
  const policy = buildContentSecurityPolicy(nonce, { development: process.env.NODE_ENV === "development", https });
  const requestHeaders = new Headers(request.headers);
  requestHeaders.set("x-nonce", nonce);
  requestHeaders.set("Content-Security-Policy", policy);
  const response = NextResponse.next({ request: { headers: requestHeaders } });
  response.headers.set("Content-Security-Policy", policy);
  if (https) response.headers.set("Strict-Transport-Security", STRICT_TRANSPORT_SECURITY);
  return response;
}

export const config = {
  // Every page, sign-in included (for its CSP); not next-auth's routes, JSON APIs or static assets (the icon too).
  // sw.js too: the browser fetches the service worker script itself, and a signed-out redirect would fail its update.
  matcher: ["/((?!api/|_next/|favicon\\.ico|icon\\.svg|robots\\.txt|sw\\.js).*)"],
};
