"use client";

import { useActionState } from "react";
import { addSite, changeOrganisationAdmin, changeSiteName } from "./actions";
import { FieldError, FormStatus } from "@/app/ui/form-status";

export function AddSiteForm() {
  const [state, action, pending] = useActionState(addSite, null);
  const invalid = (field: string) => (state && !state.ok && state.fieldErrors[field] ? true : undefined);
  const typed = (field: string) => (state && !state.ok ? state.values?.[field] : undefined);
  return (
    <form action={action} className="stack" aria-labelledby="add-site-heading" noValidate>
      <h2 id="add-site-heading">Add a site</h2>
      <FormStatus id="add-site-result" state={state} />
      <div className="field">
        <label htmlFor="site-name">Name</label>
        <input id="site-name" name="name" defaultValue={typed("name")} required aria-invalid={invalid("name")} aria-describedby="site-name-error" placeholder="e.g. North Road School" />
        <FieldError id="site-name-error" state={state} field="name" />
      </div>
      <div className="field">
        <label htmlFor="site-slug">Short name</label>
        <input id="site-slug" name="slug" defaultValue={typed("slug")} required aria-invalid={invalid("slug")} aria-describedby="site-slug-hint site-slug-error" placeholder="e.g. north-road" />
        <span id="site-slug-hint" className="hint">
          Lower-case letters, digits and hyphens; shown in the site switcher.
        </span>
        <FieldError id="site-slug-error" state={state} field="slug" />
      </div>
      <button type="submit" disabled={pending}>
        Add site
      </button>
    </form>
  );
}

export function RenameSiteForm({ siteId, name, slug }: { siteId: string; name: string; slug: string }) {
  const [state, action, pending] = useActionState(changeSiteName, null);
  const invalid = (field: string) => (state && !state.ok && state.fieldErrors[field] ? true : undefined);
  return (
    <form action={action} className="inline-form" aria-label={`Rename ${name}`}>
      <input type="hidden" name="siteId" value={siteId} />
      <label className="visually-hidden" htmlFor={`name-${siteId}`}>
        Name of {name}
      </label>
      <input id={`name-${siteId}`} name="name" defaultValue={name} aria-invalid={invalid("name")} aria-describedby={`rename-${siteId}-result`} />
      <label className="visually-hidden" htmlFor={`slug-${siteId}`}>
        Short name of {name}
      </label>
      <input id={`slug-${siteId}`} name="slug" defaultValue={slug} size={14} aria-invalid={invalid("slug")} aria-describedby={`rename-${siteId}-result`} />
      <button type="submit" className="secondary" disabled={pending}>
        Save
      </button>
      <FormStatus id={`rename-${siteId}-result`} state={state} />
    </form>
  );
}

export function OrganisationAdminForm({ userId, name, organisationAdmin }: { userId: string; name: string; organisationAdmin: boolean }) {
  const [state, action, pending] = useActionState(changeOrganisationAdmin, null);
  return (
    <form action={action} className="inline-form" aria-label={`Organisation admin: ${name}`}>
      <input type="hidden" name="userId" value={userId} />
      <label className="visually-hidden" htmlFor={`org-${userId}`}>
        Is {name} an organisation admin?
      </label>
      <select id={`org-${userId}`} name="organisationAdmin" defaultValue={organisationAdmin ? "true" : "false"} aria-describedby={`org-${userId}-result`}>
        <option value="false">no</option>
        <option value="true">organisation admin</option>
      </select>
      <button type="submit" className="secondary" disabled={pending}>
        Save
      </button>
      <FormStatus id={`org-${userId}-result`} state={state} />
    </form>
  );
}
