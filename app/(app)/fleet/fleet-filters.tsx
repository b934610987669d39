import type { FleetQuery } from "@/lib/validation/fleet-query";

/** GET form: the filters and sort live in the query string, so a view can be bookmarked and shared. */
export function FleetFilters({ query }: { query: FleetQuery }) {
  return (
    <form className="filters no-print" method="get" aria-label="Filter and sort the fleet">
      <div className="field">
        <label htmlFor="health">Health</label>
        <select id="health" name="health" defaultValue={query.health}>
          <option value="all">Any</option>
          <option value="hold">Hold</option>
          <option value="watch">Watch</option>
          <option value="fine">Fine</option>
          <option value="not enough data">Not enough data</option>
        </select>
      </div>
      <div className="field">
        <label htmlFor="clearance">Clearance</label>
        <select id="clearance" name="clearance" defaultValue={query.clearance}>
          <option value="all">Any</option>
          <option value="valid">Cleared</option>
          <option value="not-valid">Not lendable</option>
          <option value="none">Never cleared</option>
          <option value="expired">Expired</option>
          <option value="lapsed">Lapsed</option>
          <option value="refused">Refused</option>
        </select>
      </div>
      <div className="field">
        <label htmlFor="loan">Loan</label>
        <select id="loan" name="loan" defaultValue={query.loan}>
          <option value="all">Any</option>
          <option value="out">Out</option>
          <option value="overdue">Overdue</option>
          <option value="in">In</option>
        </select>
      </div>
      <div className="field">
        <label htmlFor="sort">Sort by</label>
        <select id="sort" name="sort" defaultValue={query.sort}>
          <option value="severity">Health, most severe first</option>
          <option value="tag">Tag</option>
          <option value="hours">Hours run, most first</option>
          <option value="sweep-age">Days since sweep, oldest first</option>
        </select>
      </div>
      <button type="submit">Apply</button>
    </form>
  );
}
