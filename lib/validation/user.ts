/** Account and membership schemas, shared by the sign-in form, the admin screens and their server actions. */
import { z } from "zod";
import { ROLES } from "../auth/roles";

export const emailSchema = z
  .string({ error: "Enter an e-mail address." })
  .trim()
  .toLowerCase()
  .pipe(z.email({ error: "Enter a valid e-mail address, like name@example.org." }));

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string({ error: "Enter your password." }).min(1, "Enter your password."),
});

/** Password rules: long enough to resist guessing, not the e-mail itself, not one repeated character. */
export const passwordSchema = z
  .string({ error: "Enter a password." })
  .min(10, "Use at least 10 characters.")
  .max(200, "Use at most 200 characters.")
  .refine((p) => new Set(p).size >= 4, "Use at least 4 different characters.");

export const roleSchema = z.enum(ROLES, { error: `Choose one of: ${ROLES.join(", ")}.` });

export const newUserSchema = z
  .object({
    name: z.string().trim().min(1, "Enter a name.").max(100, "Keep the name under 100 characters."),
    email: emailSchema,
    role: roleSchema,
    password: passwordSchema,
  })
  .refine((u) => u.password.toLowerCase() !== u.email, { path: ["password"], message: "The password must not be the e-mail address." });

export type NewUserInput = z.infer<typeof newUserSchema>;

export const updateAccessSchema = z.object({
  userId: z.string().min(1),
  role: roleSchema.optional(),
  active: z.enum(["true", "false"]).transform((v) => v === "true").optional(),
});

/** Adding an account that already exists (at another site) to the current site. */
export const existingMemberSchema = z.object({ email: emailSchema, role: roleSchema });

export const removeMemberSchema = z.object({ userId: z.string().min(1) });

export const organisationAdminSchema = z.object({
  userId: z.string().min(1),
  organisationAdmin: z.enum(["true", "false"], { error: "Choose yes or no." }).transform((v) => v === "true"),
});
