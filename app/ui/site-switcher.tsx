"use client";

import { useActionState } from "react";
import { switchSite } from "@/app/(app)/site-actions";
import type { ActionResult } from "@/lib/validation/action-result";

interface SiteChoice {
  slug: string;
  name: string;
  role: string;
}

function Refusal({ state }: { state: ActionResult<null> | null }) {
  return (
    <span role="status" aria-live="polite" className={state && !state.ok ? "error" : undefined}>
      {state && !state.ok ? state.message : ""}
    </span>
  );
}

/** The header's site switcher, for people in several sites: choose a site, then "Switch". Works without script. */
export function SiteSwitcher({ current, sites }: { current: string; sites: readonly SiteChoice[] }) {
  const [state, action, pending] = useActionState(switchSite, null);
  return (
    <form action={action} className="inline-form site-switcher" aria-label="Switch site">
      <label htmlFor="site-switch">Site</label>
      <select id="site-switch" name="slug" defaultValue={current}>
        {sites.map((site) => (
          <option key={site.slug} value={site.slug}>
            {site.name} ({site.role})
          </option>
        ))}
      </select>
      <button type="submit" className="secondary" disabled={pending}>
        Switch
      </button>
      <Refusal state={state} />
    </form>
  );
}

/** One site's name as a button that switches to it and opens its dashboard (the district view's drill-down). */
export function OpenSiteButton({ slug, name }: { slug: string; name: string }) {
  const [state, action, pending] = useActionState(switchSite, null);
  return (
    <form action={action} className="inline-form">
      <input type="hidden" name="slug" value={slug} />
      <button type="submit" className="link" disabled={pending} aria-label={`${name}: open its dashboard`}>
        {name}
      </button>
      <Refusal state={state} />
    </form>
  );
}
