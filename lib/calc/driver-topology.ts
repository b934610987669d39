/**
 * The driver circuits Coilyard knows, named as in the database's `DriverTopology` enum so a
 * stored coil can be passed straight in (lib/calc stays free of Prisma imports).
 */
export type DriverTopology = "single_switch" | "push_pull" | "half_bridge" | "full_bridge";

export const DRIVER_TOPOLOGIES: readonly DriverTopology[] = ["single_switch", "push_pull", "half_bridge", "full_bridge"];

/** Plain-words names for notes and evidence text. */
export const DRIVER_TOPOLOGY_LABELS: Readonly<Record<DriverTopology, string>> = {
  single_switch: "single-switch driver",
  push_pull: "push-pull driver",
  half_bridge: "half-bridge driver",
  full_bridge: "full-bridge driver",
};
