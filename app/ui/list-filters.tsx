/**
 * The filter bar of the list pages: a GET form (filters live in the URL, so a filtered list can be
 * bookmarked and paginated on the server) and the coil picker most lists share.
 */
export function FilterForm({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <form className="filters" method="get" role="search" aria-label={label}>
      {children}
      <button type="submit">Apply</button>
    </form>
  );
}

export function CoilFilter({ coils, value }: { coils: { id: string; tag: string; name: string }[]; value: string | undefined }) {
  return (
    <div className="field">
      <label htmlFor="coil">Coil</label>
      <select id="coil" name="coil" defaultValue={value ?? ""}>
        <option value="">All coils</option>
        {coils.map((c) => (
          <option key={c.id} value={c.tag}>
            {c.tag} — {c.name}
          </option>
        ))}
      </select>
    </div>
  );
}
