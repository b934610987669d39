import type { listCoilChoices } from "@/lib/db/coils";

/** Asked first when a sweep page is opened without ?coil=: a plain GET form, no script needed. */
export function CoilPicker({ coils, action }: { coils: Awaited<ReturnType<typeof listCoilChoices>>; action: string }) {
  return (
    <form method="get" action={action} className="filters" aria-label="Choose a coil">
      <div className="field">
        <label htmlFor="pick-coil">Coil</label>
        <select id="pick-coil" name="coil" required>
          {coils.map((c) => (
            <option key={c.id} value={c.tag}>
              {c.tag} — {c.name}
            </option>
          ))}
        </select>
      </div>
      <button type="submit">Continue</button>
    </form>
  );
}
