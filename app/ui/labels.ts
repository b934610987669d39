/** Words shown for stored codes. One place, so every screen says the same thing. */
export const TOPOLOGY_LABEL: Record<string, string> = {
  single_switch: "Single switch",
  push_pull: "Push-pull (two switches)",
  half_bridge: "Half bridge",
  full_bridge: "Full bridge",
};

export const COIL_STATUS_LABEL: Record<string, string> = { planned: "Planned", active: "Active", repair: "In repair", retired: "Retired" };

export const OUTCOME_LABEL: Record<string, string> = {
  normal: "Normal",
  stopped: "Stopped early",
  anomaly: "Anomaly",
  failed: "Failed",
};

export const FAILURE_MODE_LABEL: Record<string, string> = {
  over_voltage: "Over-voltage",
  over_current: "Over-current",
  over_temperature: "Over-temperature",
  reverse_base_breakdown: "Reverse base/gate breakdown",
  mechanical: "Mechanical",
  unknown: "Unknown",
};

export const COMPONENT_KIND_LABEL: Record<string, string> = {
  switch: "Switching transistor",
  heat_sink: "Heat sink",
  snubber: "Snubber",
  clamp: "Clamp",
  fan: "Fan",
  gate_drive: "Base/gate drive",
  other: "Other",
};

export const TOP_LOAD_SHAPE_LABEL: Record<string, string> = {
  none: "None (bare)",
  sphere: "Sphere",
  disc: "Disc",
  toroid: "Toroid",
  cylinder: "Closed can",
  measured: "Measured capacitance",
};

export const AMPLITUDE_CONVENTION_LABEL: Record<string, string> = { peak_to_peak: "Peak-to-peak", peak: "Peak", rms: "RMS" };
