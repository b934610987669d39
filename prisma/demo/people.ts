/**
 * The demo club's people: the fictional Kettlewell Maker Collective. Demo passwords are listed in
 * the README; they exist only in demo databases.
 */
export const DEMO_PEOPLE = [
  { key: "admin", email: "admin@kettlewell.example", name: "Ines Okafor", role: "admin", password: "demo-admin-pass" },
  { key: "steward", email: "steward@kettlewell.example", name: "Rafe Lindqvist", role: "steward", password: "demo-steward-pass" },
  { key: "member", email: "member@kettlewell.example", name: "Tamsin Achebe", role: "member", password: "demo-member-pass" },
  { key: "member2", email: "priya@kettlewell.example", name: "Priya Halvorsen", role: "member", password: "demo-member-pass-2" },
  { key: "member3", email: "oskar@kettlewell.example", name: "Oskar Mbeki", role: "member", password: "demo-member-pass-3" },
] as const;

export type DemoPersonKey = (typeof DEMO_PEOPLE)[number]["key"];
