import NextAuth from "next-auth";
import { authOptions } from "@/lib/auth/options";

// Built per request so configuration (and the generated session secret) is read at run time, not at build.
type RouteContext = { params: Promise<{ nextauth: string[] }> };

async function handler(request: Request, context: RouteContext) {
  return NextAuth(request as never, context as never, authOptions());
}

export { handler as GET, handler as POST };
