/**
 * /bench-floor: the benchmark's floor for a page (bench/session-load.ts): what Next and React spend on any signed-in
 * page, with the proxy, the sign-in check, the layout and one paragraph, and no data of its own. The dashboard and the
 * coil page are measured against it beside the trivial route (app/api/bench-floor), so the part of a page's cost that
 * is its own shows apart from the framework's. Not found unless the server process was started with
 * COILYARD_BENCH_FLOOR=1, which only the benchmark does; it reads and writes nothing either way.
 */
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { pageUser } from "@/app/ui/page-guard";

export const metadata: Metadata = { title: "Benchmark floor" };

export default async function BenchFloorPage() {
  if (process.env.COILYARD_BENCH_FLOOR !== "1") notFound();
  await pageUser();
  return <p>The benchmark&apos;s floor for a signed-in page.</p>;
}
