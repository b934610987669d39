import Link from "next/link";

export default function NotFound() {
  return (
    <main id="main" style={{ padding: "2rem", maxWidth: "40rem", margin: "0 auto" }}>
      <h1>Not found</h1>
      <p>There is no page or record at this address. It may have been mistyped, or the record may have been removed.</p>
      <p>
        <Link href="/">Back to the fleet</Link>
      </p>
    </main>
  );
}
