/**
 * Signing in and timestamps for clients that talk HTTP without a browser: the reliability specs and the load bench.
 */

/** next-auth's credentials flow by hand (CSRF cookie and token, then the callback); returns the Cookie header. */
export async function signInByHand(baseURL: string, email: string, password: string): Promise<string> {
  const jar = new Map<string, string>();
  const keep = (response: Response) => {
    for (const cookie of response.headers.getSetCookie()) {
      const [pair] = cookie.split(";");
      const at = pair!.indexOf("=");
      jar.set(pair!.slice(0, at), pair!.slice(at + 1));
    }
  };
  const header = () => [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
  const csrf = await fetch(`${baseURL}/api/auth/csrf`);
  keep(csrf);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const callback = await fetch(`${baseURL}/api/auth/callback/credentials`, {
    method: "POST",
    redirect: "manual",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: header() },
    body: new URLSearchParams({ csrfToken, email, password, json: "true" }),
  });
  keep(callback);
  if (![...jar.keys()].some((k) => k.includes("session-token"))) throw new Error(`Sign-in as ${email} failed (status ${callback.status})`);
  return header();
}

/** A datetime-local value `minutesAgo` before now in this machine's zone (the server's, on loopback). */
export function localMinute(minutesAgo: number): string {
  const d = new Date(Date.now() - minutesAgo * 60_000);
  const pad = (n: number) => String(n).padStart(2, "0");
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`;
}
