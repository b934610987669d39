/**
 * The safety checklist a steward goes through before a coil is lent out for a demonstration.
 * Plain words, one caution per item. Answering every item "yes" means the team's recorded checks
 * were done; it never makes a build "safe". Local codes and venue rules always come first.
 */

export interface ChecklistItem {
  /** Stable id, stored with the answers; never reuse an id for a different caution. */
  id: string;
  /** The caution as the steward reads it. */
  text: string;
  /** Where the caution comes from (docs/references.md), or "common practice". */
  source: string;
}

export const DEFAULT_LENDING_CHECKLIST: readonly ChecklistItem[] = [
  {
    id: "clear-zone-one-operator",
    text: "A clear zone is marked around the coil and one named operator controls it; nobody else goes inside the zone while it runs.",
    source: "common practice",
  },
  {
    id: "discharge-wand",
    text: "A grounded discharge wand is at hand and is used on the top load and the driver before anyone touches them.",
    source: "common practice",
  },
  {
    id: "implanted-devices",
    text: "Nobody with a pacemaker, defibrillator, insulin pump or other implanted medical device comes near the coil while it runs, and the audience has been told.",
    source: "common practice",
  },
  {
    id: "supply-isolated-and-switched",
    text: "The driver's supply is isolated from the mains and switched: one clearly marked switch within the operator's reach cuts it. The supply, not the arc, is the most direct lethal hazard.",
    source: "docs/references.md, Safety: the driver's DC supply is the most direct lethal hazard",
  },
  {
    id: "no-vacuum-glassware",
    text: "No vacuum tubes, light bulbs or other evacuated glassware go near the output: high voltage across evacuated glass can give off X-rays.",
    source: "West et al., Health Physics 112(1), 2017",
  },
  {
    id: "ventilation",
    text: "The room is ventilated and runs are kept short: arcs and corona make ozone and nitrogen dioxide.",
    source: "OSHA PEL for ozone 0.1 ppm (8-h TWA); NO₂ ceiling 5 ppm",
  },
  {
    id: "fire-safety",
    text: "Nothing that can burn (paper, curtains, decorations, solvents) is within reach of the arcs, and a CO₂ or dry-powder extinguisher is at hand.",
    source: "docs/references.md, Safety: RF output can ignite things",
  },
  {
    id: "no-touching-arcs",
    text: "Nobody touches the arc or draws it by hand or with a held metal object: at these frequencies it burns at the point of contact, often without a felt shock.",
    source: "ICNIRP 2010 contact-current reference levels; Tell & Tell, BioMedical Engineering OnLine 17:2 (2018)",
  },
  {
    id: "venue-rules-and-local-codes",
    text: "The venue's rules and the local electrical and fire codes have been checked and will be followed; where they are stricter than this list, they win.",
    source: "common practice",
  },
];
