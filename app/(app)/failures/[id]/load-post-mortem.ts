/** Reads a failure and its post-mortem analysis; shared by the post-mortem page and its report. */
import { notFound } from "next/navigation";
import { getFailureDetail } from "@/lib/db/failures";
import { analyzePostMortem } from "@/lib/analysis/post-mortem";
import { getCurrentPolicy } from "@/lib/db/policy";

export async function loadPostMortem(id: string) {
  const [failure, policy] = await Promise.all([getFailureDetail(id), getCurrentPolicy()]);
  if (!failure) notFound();
  const analysis = analyzePostMortem({ coil: failure.coil, components: failure.coil.components, failure, sessionsBefore: failure.recentSessions, policy: policy.rules });
  return { failure, analysis };
}
