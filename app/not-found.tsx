import Link from "next/link";
import { ScrollableRegions } from "@/app/ui/scrollable-regions";

export default function NotFound() {
  return (
    <>
      <main id="main" style={{ padding: "2rem", maxWidth: "40rem", margin: "0 auto" }}>
        <h1>Not found</h1>
        <p>There is no page or record at this address. It may have been mistyped, or the record may have been removed.</p>
        <p>
          <Link href="/">Back to the fleet</Link>
        </p>
      </main>
      {/* Outside the signed-in layout, which mounts it for every other page: marks <main> once its tables are checked. */}
      <ScrollableRegions />
    </>
  );
}
