/**
 * The session cookie read without next-auth's handler (session-token.ts): it must accept exactly the tokens next-auth
 * itself accepts and nothing more — expired, forged and wrong-secret tokens are anonymous — and find the cookie where
 * next-auth puts it (the `__Secure-` name over https, split cookies joined in order). next-auth's own `getToken`
 * (what the proxy used before) is the reference each case is compared with.
 */
import { describe, expect, it } from "vitest";
import { encode, getToken } from "next-auth/jwt";
import { decodeSessionUserId, sessionCookieName, sessionTokenFrom, usesSecureSessionCookie } from "./session-token";

const SECRET = "a-test-secret-that-is-long-enough-0123456789";
const OTHER_SECRET = "another-secret-that-is-long-enough-9876543210";

async function nextAuthsAnswer(cookies: { name: string; value: string }[], secret: string): Promise<string | null> {
  const record = Object.fromEntries(cookies.map((cookie) => [cookie.name, cookie.value]));
  const token = await getToken({ req: { cookies: record, headers: {} } as never, secret, secureCookie: false });
  return typeof token?.sub === "string" ? token.sub : null;
}

async function bothAnswers(cookies: { name: string; value: string }[], secret = SECRET) {
  return { ours: await decodeSessionUserId(sessionTokenFrom(cookies, sessionCookieName(false)), secret), nextAuth: await nextAuthsAnswer(cookies, secret) };
}

describe("decodeSessionUserId with sessionTokenFrom", () => {
  it("reads the user id from a token next-auth encoded, as next-auth does", async () => {
    const value = await encode({ token: { sub: "user-1", email: "a@club.test" }, secret: SECRET });
    expect(await bothAnswers([{ name: "next-auth.session-token", value }])).toEqual({ ours: "user-1", nextAuth: "user-1" });
  });

  it("refuses an expired token (past next-auth's 15 s clock tolerance)", async () => {
    const value = await encode({ token: { sub: "user-1" }, secret: SECRET, maxAge: -60 });
    expect(await bothAnswers([{ name: "next-auth.session-token", value }])).toEqual({ ours: null, nextAuth: null });
  });

  it("accepts a token expired within next-auth's 15 s clock tolerance, as next-auth does", async () => {
    const value = await encode({ token: { sub: "user-1" }, secret: SECRET, maxAge: -5 });
    expect(await bothAnswers([{ name: "next-auth.session-token", value }])).toEqual({ ours: "user-1", nextAuth: "user-1" });
  });

  it("keeps each secret's key apart when decodes with two secrets alternate", async () => {
    const mine = await encode({ token: { sub: "user-a" }, secret: SECRET });
    const theirs = await encode({ token: { sub: "user-b" }, secret: OTHER_SECRET });
    for (let round = 0; round < 2; round++) {
      expect(await decodeSessionUserId(mine, SECRET)).toBe("user-a");
      expect(await decodeSessionUserId(theirs, OTHER_SECRET)).toBe("user-b");
      expect(await decodeSessionUserId(mine, OTHER_SECRET)).toBeNull();
      expect(await decodeSessionUserId(theirs, SECRET)).toBeNull();
    }
  });

  it("refuses a token made with another secret, a tampered one and plain garbage", async () => {
    const value = await encode({ token: { sub: "user-1" }, secret: OTHER_SECRET });
    expect(await bothAnswers([{ name: "next-auth.session-token", value }])).toEqual({ ours: null, nextAuth: null });
    const genuine = await encode({ token: { sub: "user-1" }, secret: SECRET });
    const tampered = genuine.slice(0, -4) + (genuine.endsWith("AAAA") ? "BBBB" : "AAAA");
    expect(await bothAnswers([{ name: "next-auth.session-token", value: tampered }])).toEqual({ ours: null, nextAuth: null });
    expect(await bothAnswers([{ name: "next-auth.session-token", value: "not-a-token" }])).toEqual({ ours: null, nextAuth: null });
  });

  it("is anonymous without the cookie, or with a token that names no user", async () => {
    expect(await bothAnswers([])).toEqual({ ours: null, nextAuth: null });
    const value = await encode({ token: { email: "a@club.test" }, secret: SECRET });
    expect(await decodeSessionUserId(sessionTokenFrom([{ name: "next-auth.session-token", value }], sessionCookieName(false)), SECRET)).toBeNull();
  });

  it("joins a split cookie in chunk order and ignores other cookies", async () => {
    const value = await encode({ token: { sub: "user-2" }, secret: SECRET });
    const third = Math.ceil(value.length / 3);
    const chunks = [
      { name: "next-auth.session-token.2", value: value.slice(2 * third) },
      { name: "coilyard-site", value: "north" },
      { name: "next-auth.session-token.0", value: value.slice(0, third) },
      { name: "next-auth.session-token.1", value: value.slice(third, 2 * third) },
    ];
    expect(sessionTokenFrom(chunks, "next-auth.session-token")).toBe(value);
    expect(await bothAnswers(chunks)).toEqual({ ours: "user-2", nextAuth: "user-2" });
  });

  it("looks for the __Secure- cookie exactly when the app's URL is https, and only there", async () => {
    expect(usesSecureSessionCookie("https://lab.example")).toBe(true);
    expect(usesSecureSessionCookie("http://localhost:3000")).toBe(false);
    expect(usesSecureSessionCookie(undefined)).toBe(false);
    expect(sessionCookieName(true)).toBe("__Secure-next-auth.session-token");
    const value = await encode({ token: { sub: "user-3" }, secret: SECRET });
    expect(sessionTokenFrom([{ name: "next-auth.session-token", value }], sessionCookieName(true))).toBeNull();
    expect(await decodeSessionUserId(sessionTokenFrom([{ name: "__Secure-next-auth.session-token", value }], sessionCookieName(true)), SECRET)).toBe("user-3");
  });
});
