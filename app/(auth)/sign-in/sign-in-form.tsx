"use client";

import { useState } from "react";
import { signIn } from "next-auth/react";

export function SignInForm({ callbackUrl }: { callbackUrl: string }) {
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  async function onSubmit(event: React.FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setPending(true);
    setError(null);
    const form = new FormData(event.currentTarget);
    const result = await signIn("credentials", {
      email: String(form.get("email") ?? ""),
      password: String(form.get("password") ?? ""),
      redirect: false,
    });
    setPending(false);
    if (!result || result.error) {
      setError(result?.error && result.error !== "CredentialsSignin" ? result.error : "Sign-in failed. Check your e-mail and password.");
      return;
    }
    window.location.assign(callbackUrl);
  }

  return (
    <form className="stack" onSubmit={onSubmit} noValidate>
      <div className="field">
        <label htmlFor="email">E-mail</label>
        <input id="email" name="email" type="email" autoComplete="username" required aria-describedby="sign-in-error" />
      </div>
      <div className="field">
        <label htmlFor="password">Password</label>
        <input id="password" name="password" type="password" autoComplete="current-password" required aria-describedby="sign-in-error" />
      </div>
      <p id="sign-in-error" className="error" role="alert" aria-live="assertive" style={{ color: "var(--hold)", minHeight: "1.5em", margin: 0 }}>
        {error}
      </p>
      <button type="submit" disabled={pending}>
        {pending ? "Signing in…" : "Sign in"}
      </button>
    </form>
  );
}
