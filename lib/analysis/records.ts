/**
 * The shapes lib/analysis reads: plain objects with the stored rows' field names, so rows from
 * lib/db can be passed straight in without lib/analysis knowing about Prisma.
 */
import type { DriverTopology } from "../calc/driver-topology";

export interface CoilRecord {
  topology: DriverTopology;
  formDiameterM: number;
  windingLengthM: number;
  turns: number;
  wireDiameterM: number;
  /** Sets the resistivity in the build prediction; copper when absent. */
  wireMaterial?: "copper" | "aluminium";
  environmentCapacitanceF: number | null;
  measuredInductanceH: number | null;
}

export interface ComponentRecord {
  id: string;
  kind: string;
  partNumber: string;
  installedAt: Date;
  removedAt: Date | null;
  switchType?: string | null;
  voltageRatingV?: number | null;
  continuousCurrentA?: number | null;
  peakCurrentA?: number | null;
  powerRating25CW?: number | null;
  maxJunctionTempC?: number | null;
  thermalResistanceJcKPerW?: number | null;
  caseToSinkKPerW?: number | null;
  sinkThermalResistanceKPerW?: number | null;
  sinkMassKg?: number | null;
  /** Clamp parts: the collector/drain level the clamp holds, V. */
  clampVoltageV?: number | null;
}

export interface SessionRecord {
  id: string;
  startedAt: Date;
  supplyVoltageV: number;
  supplyCurrentA: number;
  durationS: number;
  ambientTempC: number;
  heatSinkStartC: number | null;
  heatSinkEndC: number | null;
  runningFrequencyHz: number | null;
  peakSwitchVoltageV: number | null;
  dutyCycle: number | null;
  outcome: "normal" | "stopped" | "anomaly" | "failed";
  topLoadId?: string | null;
}

export interface SampleRecord {
  elapsedS: number;
  temperatureC: number;
}

export interface TopLoadRecord {
  id: string;
  shape: "none" | "sphere" | "disc" | "toroid" | "cylinder" | "measured";
  diameterM: number | null;
  tubeDiameterM: number | null;
  heightM: number | null;
  measuredCapacitanceF: number | null;
}

export interface SweepRecord {
  id: string;
  takenAt: Date;
  topLoadId: string | null;
  firstSeriesResonanceHz: number | null;
}
