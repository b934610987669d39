import Link from "next/link";

/** Previous/next links that keep the list's other query parameters. */
export function Pagination({
  basePath,
  params,
  page,
  pageCount,
  total,
}: {
  basePath: string;
  params: Record<string, string | undefined>;
  page: number;
  pageCount: number;
  total: number;
}) {
  const href = (p: number) => {
    const query = new URLSearchParams();
    for (const [key, value] of Object.entries(params)) if (value) query.set(key, value);
    query.set("page", String(p));
    return `${basePath}?${query.toString()}`;
  };
  return (
    <nav className="pagination" aria-label="Pages">
      {page > 1 ? <Link href={href(page - 1)}>← Previous</Link> : <span className="muted">← Previous</span>}
      <span>
        Page {page} of {pageCount} · {total} record{total === 1 ? "" : "s"}
      </span>
      {page < pageCount ? <Link href={href(page + 1)}>Next →</Link> : <span className="muted">Next →</span>}
    </nav>
  );
}
