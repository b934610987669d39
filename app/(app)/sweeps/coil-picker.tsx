import type { listCoilChoices } from "@/lib/db/coils";
import { CoilSelect } from "@/app/ui/coil-picker";

/** Asked first when a sweep page is opened without ?coil=: a plain GET form, no script needed. */
export function CoilPicker({ coils, action }: { coils: Awaited<ReturnType<typeof listCoilChoices>>; action: string }) {
  return (
    <form method="get" action={action} className="filters" aria-label="Choose a coil">
      <CoilSelect coils={coils} />
      <button type="submit">Continue</button>
    </form>
  );
}
