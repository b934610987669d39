import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { getCurrentUser } from "@/lib/auth/session";
import { SignInForm } from "./sign-in-form";

export const metadata: Metadata = { title: "Sign in" };

/** Only same-site paths are accepted as a destination after sign-in (no open redirect). */
function safeCallback(value: string | string[] | undefined): string {
  const v = Array.isArray(value) ? value[0] : value;
  return v && v.startsWith("/") && !v.startsWith("//") ? v : "/";
}

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const params = await searchParams;
  const callbackUrl = safeCallback(params.callbackUrl);
  if (await getCurrentUser()) redirect(callbackUrl);
  return (
    <div className="sign-in-page">
      <main className="sign-in-box" id="main">
        <h1>
          Coil<span style={{ color: "var(--accent)" }}>yard</span>
        </h1>
        <p className="lede">The team&apos;s logbook and fleet tracker. Sign in with the account your steward or admin gave you.</p>
        <SignInForm callbackUrl={callbackUrl} />
      </main>
    </div>
  );
}
