/**
 * The demo club's fleet: our own fictional builds, parts and history. Everything here is invented
 * for the demo; the readings are generated from these settings by prisma/demo/generate.ts using
 * lib/calc's models and seeded noise. Day numbers count back from the day the demo is loaded (0).
 */
import type { DemoPersonKey, DemoSiteKey } from "./people";

export type Topology = "single_switch" | "push_pull" | "half_bridge" | "full_bridge";

export interface DemoTopLoad {
  key: string;
  name: string;
  shape: "none" | "sphere" | "disc" | "toroid" | "cylinder";
  diameterM?: number;
  tubeDiameterM?: number;
  heightM?: number;
  fromDay: number;
}

export interface DemoSwitch {
  partNumber: string;
  manufacturer: string;
  switchType: "bjt" | "mosfet" | "igbt";
  voltageRatingV: number;
  continuousCurrentA: number;
  peakCurrentA: number;
  powerRating25CW: number;
  maxJunctionTempC: number;
  thermalResistanceJcKPerW: number;
  caseToSinkKPerW: number;
}

export interface DemoCoil {
  /** The site that keeps the coil; the club's unless said. */
  site?: DemoSiteKey;
  tag: string;
  name: string;
  builderName: string;
  status: "active" | "repair" | "retired";
  topology: Topology;
  formDiameterM: number;
  windingLengthM: number;
  wireGaugeAwg: number;
  /** Turns as wound (close-wound would be a little more: enamel and winding gaps). */
  turns: number;
  measuredDcResistanceOhm?: number;
  primaryTurns: number;
  primaryDiameterM: number;
  notes: string;
  createdDay: number;
  /** What the room really adds to the secondary's capacitance (F): hidden truth the sweeps reveal. */
  trueEnvironmentCapacitanceF: number;
  topLoads: DemoTopLoad[];
  switch: DemoSwitch;
  switchCount: number;
  sink: { partNumber: string; thermalResistanceKPerW: number; massKg: number };
  hasFan: boolean;
  /** A diode clamp into a capacitor bled to the supply, fitted from this day (single switch). */
  clampFromDay?: number;
  supplyVoltages: number[];
  /** Average supply current per volt of supply at the start (A/V), a load-line slope. */
  currentPerVolt: number;
  /** Share of input power dissipated in the switch(es). */
  switchLossFraction: number;
  sessions: { count: number; fromDay: number; toDay: number };
  /** Gradual degradation: sink resistance and current slope grow linearly to these factors by the last day. */
  drift?: { sinkResistanceFactor: number; currentFactor: number; fromDay: number };
}

const COMMON_BJT: DemoSwitch = {
  partNumber: "KX-N140",
  manufacturer: "generic",
  switchType: "bjt",
  voltageRatingV: 140,
  continuousCurrentA: 12,
  peakCurrentA: 20,
  powerRating25CW: 100,
  maxJunctionTempC: 150,
  thermalResistanceJcKPerW: 1.25,
  caseToSinkKPerW: 0.5,
};

export const DEMO_COILS: DemoCoil[] = [
  {
    tag: "KM-01",
    name: "Pocket Sprite",
    builderName: "Tamsin Achebe",
    status: "active",
    topology: "single_switch",
    formDiameterM: 0.032,
    windingLengthM: 0.1,
    wireGaugeAwg: 36,
    turns: 700,
    primaryTurns: 3,
    primaryDiameterM: 0.045,
    notes: "First build of the club. Clamp added after the June over-voltage failure.",
    createdDay: -178,
    trueEnvironmentCapacitanceF: 2.6e-12,
    topLoads: [
      { key: "bare", name: "Bare", shape: "none", fromDay: -178 },
      { key: "ball", name: "40 mm ball", shape: "sphere", diameterM: 0.04, fromDay: -150 },
    ],
    switch: COMMON_BJT,
    switchCount: 1,
    sink: { partNumber: "HS-TO220-25", thermalResistanceKPerW: 6.5, massKg: 0.03 },
    hasFan: false,
    clampFromDay: -118,
    supplyVoltages: [18, 24, 24, 24],
    currentPerVolt: 0.045,
    switchLossFraction: 0.28,
    sessions: { count: 26, fromDay: -170, toDay: -4 },
  },
  {
    tag: "KM-02",
    name: "Bench Standard",
    builderName: "Rafe Lindqvist",
    status: "active",
    topology: "single_switch",
    formDiameterM: 0.05,
    windingLengthM: 0.2,
    wireGaugeAwg: 32,
    turns: 880,
    primaryTurns: 4,
    primaryDiameterM: 0.07,
    notes: "The club's reference build: clamped from the start, big sink.",
    createdDay: -176,
    trueEnvironmentCapacitanceF: 3.4e-12,
    topLoads: [
      { key: "can", name: "Small can", shape: "cylinder", diameterM: 0.05, heightM: 0.04, fromDay: -176 },
      { key: "torus", name: "Ducting toroid", shape: "toroid", diameterM: 0.15, tubeDiameterM: 0.04, fromDay: -90 },
    ],
    switch: { ...COMMON_BJT, partNumber: "KX-M250", switchType: "mosfet", voltageRatingV: 250, continuousCurrentA: 20, peakCurrentA: 80, powerRating25CW: 150, maxJunctionTempC: 175, thermalResistanceJcKPerW: 1.0 },
    switchCount: 1,
    sink: { partNumber: "HS-EXT-100", thermalResistanceKPerW: 1.6, massKg: 0.18 },
    hasFan: false,
    clampFromDay: -176,
    supplyVoltages: [24, 24, 30, 30],
    currentPerVolt: 0.075,
    switchLossFraction: 0.22,
    sessions: { count: 30, fromDay: -172, toDay: -2 },
  },
  {
    tag: "KM-03",
    name: "Outreach Tall",
    builderName: "Priya Halvorsen",
    status: "active",
    topology: "push_pull",
    formDiameterM: 0.075,
    windingLengthM: 0.3,
    wireGaugeAwg: 30,
    turns: 1080,
    primaryTurns: 5,
    primaryDiameterM: 0.1,
    notes: "Two-switch push-pull for school visits. Travels in its own crate.",
    createdDay: -160,
    trueEnvironmentCapacitanceF: 4.5e-12,
    topLoads: [{ key: "torus", name: "Spun toroid", shape: "toroid", diameterM: 0.2, tubeDiameterM: 0.05, fromDay: -160 }],
    switch: { ...COMMON_BJT, partNumber: "KX-M200", switchType: "mosfet", voltageRatingV: 200, continuousCurrentA: 18, peakCurrentA: 70, powerRating25CW: 125, maxJunctionTempC: 175, thermalResistanceJcKPerW: 1.2 },
    switchCount: 2,
    sink: { partNumber: "HS-EXT-150F", thermalResistanceKPerW: 0.9, massKg: 0.26 },
    hasFan: true,
    supplyVoltages: [24, 24, 24, 28],
    currentPerVolt: 0.11,
    switchLossFraction: 0.16,
    sessions: { count: 24, fromDay: -155, toDay: -12 },
  },
  {
    tag: "KM-04",
    name: "Amber Spire",
    builderName: "Oskar Mbeki",
    status: "active",
    topology: "single_switch",
    formDiameterM: 0.063,
    windingLengthM: 0.25,
    wireGaugeAwg: 30,
    turns: 900,
    primaryTurns: 4,
    primaryDiameterM: 0.085,
    notes: "Runs a little warmer every month; fan intake faces the bench.",
    createdDay: -175,
    trueEnvironmentCapacitanceF: 3.9e-12,
    topLoads: [{ key: "can", name: "Large can", shape: "cylinder", diameterM: 0.09, heightM: 0.06, fromDay: -175 }],
    switch: { ...COMMON_BJT, partNumber: "KX-N300", voltageRatingV: 300, continuousCurrentA: 15, peakCurrentA: 30, powerRating25CW: 125, maxJunctionTempC: 150, thermalResistanceJcKPerW: 1.0 },
    switchCount: 1,
    sink: { partNumber: "HS-EXT-80F", thermalResistanceKPerW: 1.1, massKg: 0.15 },
    hasFan: true,
    clampFromDay: -175,
    supplyVoltages: [24, 30, 30, 30],
    currentPerVolt: 0.085,
    switchLossFraction: 0.2,
    sessions: { count: 34, fromDay: -170, toDay: -1 },
    drift: { sinkResistanceFactor: 1.8, currentFactor: 1.22, fromDay: -110 },
  },
  {
    tag: "KM-05",
    name: "Big Harbour",
    builderName: "Ines Okafor",
    status: "active",
    topology: "half_bridge",
    formDiameterM: 0.11,
    windingLengthM: 0.42,
    wireGaugeAwg: 28,
    turns: 1240,
    primaryTurns: 6,
    primaryDiameterM: 0.15,
    notes: "Largest build. Half bridge on a 48 V supply; fan replaced after the September failure.",
    createdDay: -165,
    trueEnvironmentCapacitanceF: 6.2e-12,
    topLoads: [
      { key: "torus", name: "Wide toroid", shape: "toroid", diameterM: 0.3, tubeDiameterM: 0.075, fromDay: -165 },
    ],
    switch: { ...COMMON_BJT, partNumber: "KX-G600", manufacturer: "generic", switchType: "igbt", voltageRatingV: 600, continuousCurrentA: 30, peakCurrentA: 90, powerRating25CW: 200, maxJunctionTempC: 150, thermalResistanceJcKPerW: 0.6, caseToSinkKPerW: 0.3 },
    switchCount: 2,
    sink: { partNumber: "HS-EXT-220F", thermalResistanceKPerW: 0.45, massKg: 0.6 },
    hasFan: true,
    supplyVoltages: [36, 48, 48],
    currentPerVolt: 0.06,
    switchLossFraction: 0.12,
    sessions: { count: 26, fromDay: -160, toDay: -6 },
  },
  {
    tag: "KM-06",
    name: "Little Lantern",
    builderName: "Priya Halvorsen",
    status: "active",
    topology: "single_switch",
    formDiameterM: 0.04,
    windingLengthM: 0.14,
    wireGaugeAwg: 34,
    turns: 800,
    primaryTurns: 3,
    primaryDiameterM: 0.055,
    notes: "Desk demonstrator; lights a fluorescent tube at arm's length.",
    createdDay: -140,
    trueEnvironmentCapacitanceF: 2.9e-12,
    topLoads: [{ key: "disc", name: "50 mm disc", shape: "disc", diameterM: 0.05, fromDay: -140 }],
    switch: { ...COMMON_BJT, partNumber: "KX-M200", switchType: "mosfet", voltageRatingV: 200, continuousCurrentA: 18, peakCurrentA: 70, powerRating25CW: 125, maxJunctionTempC: 175, thermalResistanceJcKPerW: 1.2 },
    switchCount: 1,
    sink: { partNumber: "HS-EXT-60", thermalResistanceKPerW: 2.4, massKg: 0.08 },
    hasFan: false,
    clampFromDay: -140,
    supplyVoltages: [12, 18, 18],
    currentPerVolt: 0.06,
    switchLossFraction: 0.2,
    sessions: { count: 22, fromDay: -135, toDay: -8 },
  },
  {
    tag: "KM-07",
    name: "Cardboard Prototype",
    builderName: "Rafe Lindqvist",
    status: "retired",
    topology: "single_switch",
    formDiameterM: 0.045,
    windingLengthM: 0.16,
    wireGaugeAwg: 32,
    turns: 720,
    primaryTurns: 3,
    primaryDiameterM: 0.06,
    notes: "Wound on a postal tube. Retired when the form softened; kept for its history.",
    createdDay: -180,
    trueEnvironmentCapacitanceF: 3.1e-12,
    topLoads: [{ key: "bare", name: "Bare", shape: "none", fromDay: -180 }],
    switch: COMMON_BJT,
    switchCount: 1,
    sink: { partNumber: "HS-TO220-25", thermalResistanceKPerW: 6.5, massKg: 0.03 },
    hasFan: false,
    supplyVoltages: [12, 15],
    currentPerVolt: 0.05,
    switchLossFraction: 0.25,
    sessions: { count: 8, fromDay: -178, toDay: -100 },
  },
];

/**
 * Fenwick Street School's coils: a classroom demonstrator and a science-fair build, each with its sweeps and sessions,
 * logged by the school's own people. Coil tags are unique per site, so the school numbers its own.
 */
export const DEMO_SCHOOL_COILS: DemoCoil[] = [
  {
    site: "school",
    tag: "FS-01",
    name: "Classroom Spark",
    builderName: "Year 10 electronics group",
    status: "active",
    topology: "single_switch",
    formDiameterM: 0.05,
    windingLengthM: 0.2,
    wireGaugeAwg: 34,
    turns: 1150,
    primaryTurns: 3,
    primaryDiameterM: 0.055,
    notes: "Built by the Year 10 group in the autumn term; clamped from the start.",
    createdDay: -100,
    trueEnvironmentCapacitanceF: 3.0e-12,
    topLoads: [{ key: "ball", name: "80 mm ball", shape: "sphere", diameterM: 0.08, fromDay: -100 }],
    switch: { ...COMMON_BJT, partNumber: "KX-M200", switchType: "mosfet", voltageRatingV: 200, continuousCurrentA: 18, peakCurrentA: 70, powerRating25CW: 125, maxJunctionTempC: 175, thermalResistanceJcKPerW: 1.2 },
    switchCount: 1,
    sink: { partNumber: "HS-EXT-60", thermalResistanceKPerW: 2.4, massKg: 0.08 },
    hasFan: false,
    clampFromDay: -100,
    supplyVoltages: [12, 18, 18],
    currentPerVolt: 0.06,
    switchLossFraction: 0.2,
    sessions: { count: 12, fromDay: -95, toDay: -5 },
  },
  {
    site: "school",
    tag: "FS-02",
    name: "Science Fair Tower",
    builderName: "Marguerite Osei",
    status: "active",
    topology: "push_pull",
    formDiameterM: 0.063,
    windingLengthM: 0.24,
    wireGaugeAwg: 30,
    turns: 880,
    primaryTurns: 4,
    primaryDiameterM: 0.085,
    notes: "The science fair's centrepiece; runs only with a teacher at the switch.",
    createdDay: -90,
    trueEnvironmentCapacitanceF: 4.0e-12,
    topLoads: [{ key: "torus", name: "Ducting toroid", shape: "toroid", diameterM: 0.15, tubeDiameterM: 0.04, fromDay: -90 }],
    switch: { ...COMMON_BJT, partNumber: "KX-M200", switchType: "mosfet", voltageRatingV: 200, continuousCurrentA: 18, peakCurrentA: 70, powerRating25CW: 125, maxJunctionTempC: 175, thermalResistanceJcKPerW: 1.2 },
    switchCount: 2,
    sink: { partNumber: "HS-EXT-150F", thermalResistanceKPerW: 0.9, massKg: 0.26 },
    hasFan: true,
    supplyVoltages: [24, 24, 28],
    currentPerVolt: 0.1,
    switchLossFraction: 0.16,
    sessions: { count: 10, fromDay: -85, toDay: -9 },
  },
];

/** Two failures with completed post-mortems. */
export const DEMO_FAILURES = [
  {
    coilTag: "KM-01",
    day: -120,
    mode: "over_voltage" as const,
    symptoms: "Arc stopped with a snap; transistor collector–emitter shorted, supply fuse blown.",
    rootCause:
      "Unclamped collector ringing: measured peaks of 130–136 V on a 24 V supply in the runs before, against a 140 V rating (about 95 %).",
    correctiveAction: "Replaced the transistor and fitted a diode clamp into a capacitor bled by a resistor to the supply; peaks now under 3× supply.",
    reportedBy: "member" as DemoPersonKey,
    closedBy: "steward" as DemoPersonKey,
  },
  {
    coilTag: "KM-05",
    day: -62,
    mode: "over_temperature" as const,
    symptoms: "Output faded over ten minutes, then one IGBT failed short. Heat sink too hot to touch; fan not turning.",
    rootCause: "Fan bearing seized; the sink ran without airflow and its temperature kept rising past the point the junctions could take.",
    correctiveAction: "Replaced both IGBTs and the fan; added a fan-check step before every run.",
    reportedBy: "member2" as DemoPersonKey,
    closedBy: "admin" as DemoPersonKey,
  },
];

/** Loans: one returned earlier in the season, one out now. Clearances are issued for each. */
export const DEMO_LOANS = [
  { coilTag: "KM-02", clearedDay: -45, outDay: -40, backDay: -37, expectedBackDay: -37, borrower: "Dunmore Primary School", contact: "science lead, front office", event: "Science week assembly", condition: "Returned in good order; top load slightly dented.", },
  { coilTag: "KM-03", clearedDay: -10, outDay: -3, backDay: null, expectedBackDay: 4, borrower: "Riverside Library", contact: "events desk", event: "Saturday family science morning", condition: null },
];

/** KM-02 holds a current clearance and is in the workshop. */
export const DEMO_STANDING_CLEARANCE = { coilTag: "KM-02", clearedDay: -5 };

/** The school's classroom coil holds a current clearance too, decided by the school's steward. */
export const DEMO_SCHOOL_CLEARANCE = { coilTag: "FS-01", clearedDay: -3 };
