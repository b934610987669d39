type CoilChoice = { id: string; tag: string; name: string };

/** The coil field of every "which coil?" form; it sends the tag as ?coil=. */
export function CoilSelect({ coils }: { coils: readonly CoilChoice[] }) {
  return (
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
  );
}

/**
 * The "which coil?" step of the bench forms (log a session, record a failure): a GET form that
 * comes back to the same page with ?coil=TAG, saying so when a typed or linked tag matched nothing.
 */
export function CoilPicker({ title, unknownTag, coils }: { title: string; unknownTag: string | undefined; coils: readonly CoilChoice[] }) {
  return (
    <>
      <h1>{title}</h1>
      {unknownTag && <p className="notice warn">There is no coil tagged {unknownTag}. Choose one below.</p>}
      <form method="get" className="stack bench-form" aria-label="Choose a coil">
        <CoilSelect coils={coils} />
        <button type="submit" className="big-button">
          Continue
        </button>
      </form>
    </>
  );
}
