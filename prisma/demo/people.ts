/**
 * The demo's sites and people: the fictional Northmoor Coil Network, whose first site is the Kettlewell Maker
 * Collective (the club every earlier demo showed, on the default site "site-main") and whose second is a school, Fenwick
 * Street School, with a few coils of its own. Demo passwords are listed in the README; they exist only in demo
 * databases.
 */
import type { Role } from "../../lib/auth/roles";
import { DEFAULT_SITE_ID } from "../../lib/db/site-scope";

export const DEMO_ORGANISATION_NAME = "Northmoor Coil Network";

export const DEMO_SITES = [
  { key: "club", id: DEFAULT_SITE_ID, slug: "kettlewell", name: "Kettlewell Maker Collective" },
  { key: "school", id: "site-fenwick", slug: "fenwick", name: "Fenwick Street School" },
] as const;

export type DemoSiteKey = (typeof DEMO_SITES)[number]["key"];

interface DemoPerson {
  key: string;
  email: string;
  name: string;
  password: string;
  /** The role at each site the person belongs to. */
  sites: Partial<Record<DemoSiteKey, Role>>;
  /** Manages sites and sees every one (admin at each). */
  organisationAdmin?: boolean;
}

export const DEMO_PEOPLE = [
  { key: "admin", email: "admin@kettlewell.example", name: "Ines Okafor", sites: { club: "admin" }, password: "demo-admin-pass" },
  { key: "steward", email: "steward@kettlewell.example", name: "Rafe Lindqvist", sites: { club: "steward" }, password: "demo-steward-pass" },
  { key: "member", email: "member@kettlewell.example", name: "Tamsin Achebe", sites: { club: "member" }, password: "demo-member-pass" },
  // Helps out at the school too, so the demo shows the site switcher.
  { key: "member2", email: "priya@kettlewell.example", name: "Priya Halvorsen", sites: { club: "member", school: "member" }, password: "demo-member-pass-2" },
  { key: "member3", email: "oskar@kettlewell.example", name: "Oskar Mbeki", sites: { club: "member" }, password: "demo-member-pass-3" },
  { key: "schoolSteward", email: "steward@fenwick.example", name: "Marguerite Osei", sites: { school: "steward" }, password: "demo-school-steward-pass" },
  { key: "schoolMember", email: "member@fenwick.example", name: "Jonah Castellanos", sites: { school: "member" }, password: "demo-school-member-pass" },
  { key: "organiser", email: "coordinator@northmoor.example", name: "Wren Adeyemi", sites: {}, organisationAdmin: true, password: "demo-organisation-pass" },
] as const satisfies readonly DemoPerson[];

export type DemoPersonKey = (typeof DEMO_PEOPLE)[number]["key"];
