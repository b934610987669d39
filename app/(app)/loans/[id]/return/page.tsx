import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";
import { getLoan, listSessionsInLoanWindow } from "@/lib/db/loans";
import { formatDate, formatDateTime, formatDuration } from "@/lib/units/format";
import { OUTCOME_LABEL } from "@/app/ui/labels";
import { ReturnForm } from "./return-form";

export const metadata: Metadata = { title: "Return a loan" };

/** "2026-05-02T14:30" in the server's (the lab's) time zone, for a datetime-local input. */
function toLocalInput(d: Date): string {
  const pad = (n: number) => String(n).padStart(2, "0");
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`;
}

export default async function ReturnLoanPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await pageUser("steward");
  const { id } = await params;
  const loan = await getLoan(user.scope, id);
  if (!loan) notFound();
  const now = new Date();
  const sessions = loan.returnedAt ? [] : await listSessionsInLoanWindow(user.scope, loan, now);
  return (
    <>
      <h1>
        Return {loan.coil.tag} — {loan.coil.name}
      </h1>
      <p className="lede">
        Lent to {loan.borrower} for {loan.event} on {formatDate(loan.outAt)}; expected back {formatDate(loan.expectedBackAt)}.
      </p>
      {loan.returnedAt ? (
        <p className="notice ok">
          Returned on {formatDateTime(loan.returnedAt)}: {loan.returnCondition}
        </p>
      ) : (
        <ReturnForm
          loanId={loan.id}
          defaultReturnedAt={toLocalInput(now)}
          sessions={sessions
            .filter((s) => s.loanId === null || s.loanId === loan.id)
            .map((s) => ({ id: s.id, label: `${formatDateTime(s.startedAt)}, ${formatDuration(s.durationS)} at ${s.supplyVoltageV} V (${OUTCOME_LABEL[s.outcome]})` }))}
        />
      )}
    </>
  );
}
