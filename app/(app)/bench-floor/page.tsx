/**
 * /bench-floor: the benchmark's floors for a page (bench/session-load.ts). With no query, what Next and React spend on
 * any signed-in page: the proxy, the sign-in check, the layout and one paragraph, no data of its own. With
 * `?elements=N`, the same page with N plain elements in it (a span of a few words each), so the cost of rendering a
 * page of a given size shows apart from the cost of what a real page reads and works out. The dashboard and the coil
 * page are measured against both, beside the trivial route (app/api/bench-floor).
 * Not found unless the server process was started with COILYARD_BENCH_FLOOR=1, which only the benchmark does; it reads
 * and writes nothing either way.
 */
import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { z } from "zod";
import { pageUser } from "@/app/ui/page-guard";

export const metadata: Metadata = { title: "Benchmark floor" };

/** Bounded, so a stray request cannot ask for a huge page; anything unreadable is an empty page. */
const elementsSchema = z.coerce.number().int().min(0).max(5000).catch(0);

export default async function BenchFloorPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  if (process.env.COILYARD_BENCH_FLOOR !== "1") notFound();
  await pageUser();
  const elements = elementsSchema.parse((await searchParams).elements ?? 0);
  return (
    <>
      <p>The benchmark&apos;s floor for a signed-in page.</p>
      {elements > 0 && (
        <div>
          {Array.from({ length: elements - 1 }, (_, i) => (
            <span key={i}>plain element {i} </span>
          ))}
        </div>
      )}
    </>
  );
}
