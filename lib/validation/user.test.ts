import { describe, expect, it } from "vitest";
import { newUserSchema, signInSchema } from "./user";

describe("account schemas", () => {
  it("normalise the e-mail and require a password at sign-in", () => {
    expect(signInSchema.parse({ email: "  Ada@Example.ORG ", password: "x" }).email).toBe("ada@example.org");
    const r = signInSchema.safeParse({ email: "ada@example.org", password: "" });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual(["password"]);
  });

  it("refuse weak passwords with a reason under the password field", () => {
    const base = { name: "Ada", email: "ada@example.org", role: "member" };
    for (const password of ["short", "aaaaaaaaaaaa", "ADA@example.org"]) {
      const r = newUserSchema.safeParse({ ...base, password });
      expect(r.success, password).toBe(false);
      expect(r.error?.issues.some((i) => i.path[0] === "password")).toBe(true);
    }
    expect(newUserSchema.safeParse({ ...base, password: "coil-wind-42" }).success).toBe(true);
  });

  it("refuse an unknown role", () => {
    const r = newUserSchema.safeParse({ name: "A", email: "a@b.org", role: "owner", password: "coil-wind-42" });
    expect(r.error?.issues[0]?.path).toEqual(["role"]);
  });
});
