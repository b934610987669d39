"use server";

import { revalidatePath } from "next/cache";
import { redirect } from "next/navigation";
import { guardAction } from "@/lib/auth/guard";
import { createLoan, LoanRefusedError, returnLoan } from "@/lib/db/loans";
import { loanCreateSchema, loanReturnSchema } from "@/lib/validation/loan";
import { echoForm, invalid, refused, type ActionResult } from "@/lib/validation/action-result";

function refusal(error: LoanRefusedError, form: FormData) {
  return refused(error.message, error.field ? { [error.field]: [error.message] } : {}, echoForm(form));
}

/** Lends a coil; the server checks its clearance stands and that it is not already out. */
export async function lendCoilAction(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  const result = await guardAction<string>("steward", async (user) => {
    const parsed = loanCreateSchema.safeParse({
      coilId: form.get("coilId"),
      borrower: form.get("borrower"),
      borrowerContact: form.get("borrowerContact") ?? "",
      event: form.get("event"),
      expectedBackAt: form.get("expectedBackAt"),
      borrowerSiteId: form.get("borrowerSiteId"),
    });
    if (!parsed.success) return invalid(parsed.error, "Some fields need attention.", echoForm(form));
    try {
      const loan = await createLoan(user.scope, parsed.data);
      return { ok: true, data: loan.id };
    } catch (error) {
      if (error instanceof LoanRefusedError) return refusal(error, form);
      throw error;
    }
  });
  if (!result.ok) return result;
  revalidatePath("/");
  revalidatePath("/loans");
  // The confirmation: the handover sheet to print and sign as the coil leaves.
  redirect(`/loans/${result.data}/sheet?lent=1`);
}

/** Takes a coil back, with its condition and the sessions run while away. */
export async function returnLoanAction(_previous: ActionResult<null> | null, form: FormData): Promise<ActionResult<null>> {
  const result = await guardAction<string>("steward", async (user) => {
    const parsed = loanReturnSchema.safeParse({
      loanId: form.get("loanId"),
      returnedAt: form.get("returnedAt"),
      returnCondition: form.get("returnCondition"),
      returnNotes: form.get("returnNotes") ?? "",
      sessionIds: form.getAll("sessionIds").filter((v): v is string => typeof v === "string"),
    });
    if (!parsed.success) return invalid(parsed.error, "Some fields need attention.", echoForm(form));
    try {
      const loan = await returnLoan(user.scope, parsed.data);
      return { ok: true, data: loan.id };
    } catch (error) {
      if (error instanceof LoanRefusedError) return refusal(error, form);
      throw error;
    }
  });
  if (!result.ok) return result;
  revalidatePath("/");
  revalidatePath("/loans");
  redirect("/loans?state=returned");
}
