import Link from "next/link";

export default function Forbidden() {
  return (
    <main id="main" style={{ padding: "2rem", maxWidth: "40rem", margin: "0 auto" }}>
      <h1>Not allowed</h1>
      <p>Your account&apos;s role does not allow this. Ask a steward or an admin if you need it.</p>
      <p>
        <Link href="/">Back to the fleet</Link>
      </p>
    </main>
  );
}
