import type { Metadata } from "next";
import Link from "next/link";
import { pageUser } from "@/app/ui/page-guard";
import { hasRole } from "@/lib/auth/roles";
import { listBorrowedLoans, listLoans, listLoansNeedingRecall } from "@/lib/db/loans";
import { loanListQuerySchema, type SearchParams } from "@/lib/validation/list-query";
import { formatDate } from "@/lib/units/format";
import { Pagination } from "@/app/ui/pagination";
import { FilterForm } from "@/app/ui/list-filters";
import { ClearanceBadge } from "../clearances/clearance-badge";

export const metadata: Metadata = { title: "Loans" };

export default async function LoansPage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const user = await pageUser();
  const steward = hasRole(user.role, "steward");
  const query = loanListQuerySchema.parse(await searchParams);
  const now = new Date();
  const [result, recalls, borrowed] = await Promise.all([
    listLoans(user.scope, { state: query.state }, { page: query.page }, now),
    listLoansNeedingRecall(user.scope, now),
    listBorrowedLoans(user.scope, { state: query.state }, now),
  ]);
  const recallByLoan = new Map(recalls.map((r) => [r.loanId, r]));
  return (
    <>
      <h1>Loans</h1>
      {recalls.length > 0 && (
        <section className="notice danger" role="alert" aria-labelledby="recall-heading">
          <h2 id="recall-heading">
            Recall {recalls.length === 1 ? "this coil" : `these ${recalls.length} coils`}: the clearance no longer stands
          </h2>
          <ul>
            {recalls.map((r) => (
              <li key={r.loanId}>
                <strong className="nowrap">{r.coilTag}</strong>, out with {r.borrower} for {r.event}. {r.instruction}{" "}
                <Link href={`/coils/${encodeURIComponent(r.coilTag)}`}>Coil record</Link>
              </li>
            ))}
          </ul>
        </section>
      )}
      <FilterForm label="Filter loans">
        <div className="field">
          <label htmlFor="state">Show</label>
          <select id="state" name="state" defaultValue={query.state}>
            <option value="all">All loans</option>
            <option value="out">Out now</option>
            <option value="overdue">Overdue</option>
            <option value="returned">Returned</option>
          </select>
        </div>
      </FilterForm>
      <div className="table-wrap">
        <table>
          <caption>{result.total} loan{result.total === 1 ? "" : "s"}</caption>
          <thead>
            <tr>
              <th scope="col">Coil</th>
              <th scope="col">Borrower</th>
              <th scope="col">Event</th>
              <th scope="col">Out</th>
              <th scope="col">Expected back</th>
              <th scope="col">Returned</th>
              <th scope="col">State</th>
              <th scope="col">
                <span className="visually-hidden">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {result.rows.map((loan) => {
              const overdue = !loan.returnedAt && loan.expectedBackAt < now;
              return (
                <tr key={loan.id} className={overdue ? "row-overdue" : undefined}>
                  <td className="nowrap">
                    <Link href={`/coils/${encodeURIComponent(loan.coil.tag)}`}>{loan.coil.tag}</Link>
                  </td>
                  <td>
                    {loan.borrower}
                    {loan.borrowerSite && <span className="muted"> ({loan.borrowerSite.name})</span>}
                  </td>
                  <td>{loan.event}</td>
                  <td className="nowrap">{formatDate(loan.outAt)}</td>
                  <td className="nowrap">{formatDate(loan.expectedBackAt)}</td>
                  <td className="nowrap">{formatDate(loan.returnedAt)}</td>
                  <td>
                    <span className={`badge badge-${loan.returnedAt ? "closed" : overdue ? "overdue" : "out"}`}>
                      {loan.returnedAt ? "Returned" : overdue ? "Overdue" : "Out"}
                    </span>
                    {recallByLoan.has(loan.id) && (
                      <>
                        {" "}
                        <span className="badge badge-hold">Recall</span>
                      </>
                    )}
                  </td>
                  <td>
                    <Link href={`/clearances/${loan.clearanceId}`}>Clearance</Link>{" "}
                    <Link href={`/loans/${loan.id}/sheet`} aria-label={`Handover sheet for ${loan.coil.tag}`}>
                      Handover sheet
                    </Link>
                    {steward && !loan.returnedAt && (
                      <>
                        {" "}
                        <Link href={`/loans/${loan.id}/return`} className="button secondary" aria-label={`Return ${loan.coil.tag}`}>
                          Return
                        </Link>
                      </>
                    )}
                  </td>
                </tr>
              );
            })}
            {result.rows.length === 0 && (
              <tr>
                <td colSpan={8}>No loans to show.</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <Pagination basePath="/loans" params={{ state: query.state }} page={result.page} pageCount={result.pageCount} total={result.total} />
      {borrowed.length > 0 && (
        <section aria-labelledby="borrowed-heading">
          <h2 id="borrowed-heading">Borrowed from other sites</h2>
          <p className="muted">
            Coils other sites lent to {user.site.name}&apos;s events: their loan sheet and clearance sheet. The lending site keeps the coil&apos;s record and takes
            it back.
          </p>
          <div className="table-wrap">
            <table>
              <caption>
                {borrowed.length} loan{borrowed.length === 1 ? "" : "s"} from other sites
              </caption>
              <thead>
                <tr>
                  <th scope="col">Coil</th>
                  <th scope="col">From</th>
                  <th scope="col">Borrower</th>
                  <th scope="col">Event</th>
                  <th scope="col">Out</th>
                  <th scope="col">Expected back</th>
                  <th scope="col">Returned</th>
                  <th scope="col">Clearance now</th>
                  <th scope="col">
                    <span className="visually-hidden">Sheets</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {borrowed.map((loan) => (
                  <tr key={loan.id} className={!loan.returnedAt && loan.expectedBackAt < now ? "row-overdue" : undefined}>
                    <td className="nowrap">
                      {loan.coil.tag} <span className="muted">{loan.coil.name}</span>
                    </td>
                    <td>{loan.lendingSite}</td>
                    <td>{loan.borrower}</td>
                    <td>{loan.event}</td>
                    <td className="nowrap">{formatDate(loan.outAt)}</td>
                    <td className="nowrap">{formatDate(loan.expectedBackAt)}</td>
                    <td className="nowrap">{formatDate(loan.returnedAt)}</td>
                    <td>
                      <ClearanceBadge state={loan.clearanceState} withReason />
                    </td>
                    <td>
                      <Link href={`/loans/${loan.id}/sheet`} aria-label={`Loan sheet for ${loan.coil.tag} from ${loan.lendingSite}`}>
                        Loan sheet
                      </Link>{" "}
                      <Link href={`/clearances/${loan.clearanceId}/sheet`} aria-label={`Clearance sheet for ${loan.coil.tag} from ${loan.lendingSite}`}>
                        Clearance sheet
                      </Link>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </section>
      )}
    </>
  );
}
