/** Reads a failure and its post-mortem analysis; shared by the post-mortem page and its report. */
import { notFound } from "next/navigation";
import { getFailureDetail } from "@/lib/db/failures";
import { analyzePostMortem } from "@/lib/analysis/post-mortem";
import { getCurrentPolicy } from "@/lib/db/policy";
import type { SiteScope } from "@/lib/db/site-scope";

/** A failure of the scope's site (another site's is not found). */
export async function loadPostMortem(scope: SiteScope, id: string) {
  const [failure, policy] = await Promise.all([getFailureDetail(scope, id), getCurrentPolicy(scope)]);
  if (!failure) notFound();
  const analysis = analyzePostMortem({ coil: failure.coil, components: failure.coil.components, failure, sessionsBefore: failure.recentSessions, policy: policy.rules });
  return { failure, analysis };
}
