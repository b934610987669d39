import Link from "next/link";
import { forbidden, redirect } from "next/navigation";
import { AuthError, getCurrentUser } from "@/lib/auth/session";
import { MainNav } from "@/app/ui/main-nav";
import { SignOutButton } from "@/app/ui/sign-out-button";
import { StackedTableLabels } from "@/app/ui/stacked-table-labels";
import { ScrollableRegions } from "@/app/ui/scrollable-regions";
import { SiteSwitcher } from "@/app/ui/site-switcher";

/**
 * Every signed-in page: the header names the current site always (every page shows that site's records only), with a
 * switcher for people in several sites, and the footer's caution.
 */
export default async function AppLayout({ children }: { children: React.ReactNode }) {
  // An account whose last membership was removed while signed in reaches no site: the 403 page says so.
  const user = await getCurrentUser().catch((error: unknown) => (error instanceof AuthError ? forbidden() : Promise.reject(error)));
  if (!user) redirect("/sign-in");
  return (
    <>
      <a className="skip-link" href="#main">
        Skip to content
      </a>
      <header className="site-header">
        <Link href="/" className="brand">
          Coil<span>yard</span>
        </Link>
        <MainNav showAdmin={user.role === "admin"} showDistrict={user.organisationAdmin} />
        <div className="user-menu">
          {user.sites.length > 1 ? (
            <SiteSwitcher current={user.site.slug} sites={user.sites.map(({ slug, name, role }) => ({ slug, name, role }))} />
          ) : (
            <span className="current-site">{user.site.name}</span>
          )}
          <span>
            {user.name} · <span className="badge badge-neutral">{user.role}</span>
          </span>
          <SignOutButton />
        </div>
      </header>
      <main id="main">{children}</main>
      <StackedTableLabels />
      <ScrollableRegions />
      <footer className="site-footer">
        High voltage and RF: follow your local codes, venue rules and licensed practice. Coilyard records the team&apos;s checks; it
        does not certify any build as safe.
      </footer>
    </>
  );
}
