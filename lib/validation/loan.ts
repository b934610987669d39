/** Lending a coil and taking it back. Dates come from date and datetime-local inputs (the lab's local time). */
import { z } from "zod";

/** "2026-05-02" (date input) → that day at 17:00 local; "2026-05-02T14:30" → that local time. */
function parseLocalDate(value: string): Date | null {
  const day = /^(\d{4})-(\d{2})-(\d{2})$/.exec(value);
  if (day) {
    const d = new Date(Number(day[1]), Number(day[2]) - 1, Number(day[3]), 17, 0, 0);
    return d.getDate() === Number(day[3]) ? d : null;
  }
  const stamp = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::\d{2})?$/.exec(value);
  if (stamp) {
    const d = new Date(Number(stamp[1]), Number(stamp[2]) - 1, Number(stamp[3]), Number(stamp[4]), Number(stamp[5]));
    return Number.isNaN(d.getTime()) || d.getDate() !== Number(stamp[3]) ? null : d;
  }
  return null;
}

const localDateField = (label: string) =>
  z.string({ error: `${label}: enter a date.` }).trim().transform((raw, ctx) => {
    const d = parseLocalDate(raw);
    if (!d) {
      ctx.addIssue({ code: "custom", message: `${label}: enter a date as YYYY-MM-DD${raw ? `; “${raw.slice(0, 30)}” is not one` : ""}.` });
      return z.NEVER;
    }
    return d;
  });

export const loanCreateSchema = z.object({
  coilId: z.string({ error: "Coil: missing." }).min(1, { error: "Coil: missing." }),
  borrower: z.string({ error: "Borrower: required." }).trim().min(2, { error: "Borrower: at least 2 characters." }).max(120, { error: "Borrower: at most 120 characters." }),
  borrowerContact: z.string().trim().max(200, { error: "Contact: at most 200 characters." }).default(""),
  event: z.string({ error: "Event: required." }).trim().min(2, { error: "Event: at least 2 characters." }).max(200, { error: "Event: at most 200 characters." }),
  expectedBackAt: localDateField("Expected back"),
  /** Another site's event borrows the coil; empty (or absent) for a loan within the coil's own site. */
  borrowerSiteId: z
    .string({ error: "Borrowing site: choose one of the sites listed." })
    .trim()
    .max(100, { error: "Borrowing site: choose one of the sites listed." })
    .nullish()
    .transform((id) => (id ? id : null)),
});
/** The borrowing site may be left out by callers that lend within the site (scripts, tests). */
export type LoanCreateInput = Omit<z.output<typeof loanCreateSchema>, "borrowerSiteId"> & { borrowerSiteId?: string | null };

export const loanReturnSchema = z.object({
  loanId: z.string().min(1, { error: "Loan: missing." }),
  returnedAt: localDateField("Returned at"),
  returnCondition: z.string({ error: "Condition on return: required." }).trim().min(2, { error: "Condition on return: describe it in a few words." }).max(500, { error: "Condition on return: at most 500 characters." }),
  returnNotes: z.string().trim().max(2000, { error: "Notes: at most 2000 characters." }).default(""),
  sessionIds: z.array(z.string().min(1)).max(500).default([]),
});
export type LoanReturnInput = z.output<typeof loanReturnSchema>;
