/**
 * Sends anonymous visitors to the sign-in page. A convenience only: every page, action and route
 * handler checks the session and role itself (lib/auth/session.ts). API routes are not redirected;
 * they answer 401 themselves.
 */
import { NextResponse, type NextRequest } from "next/server";
import { getToken } from "next-auth/jwt";
import { appEnv } from "@/lib/config/env";

export async function proxy(request: NextRequest) {
  const token = await getToken({ req: request, secret: appEnv().NEXTAUTH_SECRET });
  if (token) return NextResponse.next();
  const signIn = new URL("/sign-in", request.url);
  const target = request.nextUrl.pathname + request.nextUrl.search;
  if (target !== "/") signIn.searchParams.set("callbackUrl", target);
  return NextResponse.redirect(signIn);
}

export const config = {
  // Everything except sign-in, next-auth's own routes, JSON APIs and static assets.
  matcher: ["/((?!sign-in|api/|_next/|favicon\\.ico|robots\\.txt).*)"],
};
