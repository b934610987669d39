/**
 * The broadcasting allocations a coil's fundamental should stay out of, and the harmonics of its
 * drive that land in them (worth showing, not worth blocking): the medium-wave (AM) band in every
 * ITU region and, in Region 1, the long-wave band, where many tall secondaries resonate.
 */
import { CalcInputError, requirePositive } from "./errors";

/** ITU region: 1 Europe/Africa/Middle East/former USSR, 2 the Americas, 3 Asia–Pacific. */
export type ItuRegion = 1 | 2 | 3;

/** Edges of a broadcasting allocation and its channel spacing, all in Hz. */
export interface BroadcastBand {
  readonly lowerEdge: number;
  readonly upperEdge: number;
  readonly channelSpacing: number;
}

export type BroadcastBandName = "long-wave" | "medium-wave";

/** A broadcasting allocation with its name, for messages that must say which band. */
export interface NamedBroadcastBand extends BroadcastBand {
  readonly name: BroadcastBandName;
}

/**
 * ITU Radio Regulations Article 5 medium-wave broadcasting allocations.
 * Regions 1 and 3: 526.5–1606.5 kHz, 9 kHz channels (Geneva 1975 plan; confirmed).
 * Region 2: 525–1705 kHz, 10 kHz channels (525–535 kHz confirmed via RR 5.86; the 1605–1705 kHz
 * extension from memory; the US carriers 540–1700 kHz of 47 CFR §73.14 sit inside it).
 */
const MEDIUM_WAVE: Readonly<Record<ItuRegion, BroadcastBand>> = {
  1: { lowerEdge: 526.5e3, upperEdge: 1606.5e3, channelSpacing: 9e3 },
  2: { lowerEdge: 525e3, upperEdge: 1705e3, channelSpacing: 10e3 },
  3: { lowerEdge: 526.5e3, upperEdge: 1606.5e3, channelSpacing: 9e3 },
};

/**
 * ITU RR Article 5, LF broadcasting in Region 1 only: 148.5–283.5 kHz (148.5–255 kHz broadcasting,
 * 255–283.5 kHz shared with aeronautical radionavigation), 9 kHz channels (Geneva 1975 plan). Edges
 * from memory, not re-read in the table; Regions 2 and 3 have no LF broadcasting allocation (from memory).
 */
const LONG_WAVE_REGION_1: BroadcastBand = { lowerEdge: 148.5e3, upperEdge: 283.5e3, channelSpacing: 9e3 };

function requireRegion(region: number): ItuRegion {
  if (region !== 1 && region !== 2 && region !== 3) throw new CalcInputError("region", "ITU region 1, 2 or 3", region);
  return region;
}

/** The medium-wave broadcasting band of an ITU region, Hz (ITU RR Article 5; see MEDIUM_WAVE for what is confirmed). */
export function broadcastBand(region: ItuRegion): BroadcastBand {
  return MEDIUM_WAVE[requireRegion(region)];
}

/** The long-wave broadcasting band of an ITU region, Hz, or null where there is none (ITU RR Article 5; Region 1 only, from memory). */
export function longWaveBroadcastBand(region: ItuRegion): BroadcastBand | null {
  return requireRegion(region) === 1 ? LONG_WAVE_REGION_1 : null;
}

/** Every broadcasting band of the region below 2 MHz, lowest first (ITU RR Article 5). */
export function broadcastBands(region: ItuRegion): NamedBroadcastBand[] {
  const longWave = longWaveBroadcastBand(region);
  return [...(longWave ? [{ ...longWave, name: "long-wave" as const }] : []), { ...broadcastBand(region), name: "medium-wave" as const }];
}

/** The region's broadcasting band holding `frequency` (Hz), edges included, or null (ITU RR Article 5). */
export function broadcastBandAt(frequency: number, region: ItuRegion): NamedBroadcastBand | null {
  requirePositive("frequency", frequency);
  return broadcastBands(region).find((band) => frequency >= band.lowerEdge && frequency <= band.upperEdge) ?? null;
}

/**
 * Whether `frequency` (Hz) lies in one of the region's broadcasting bands, edges included: medium
 * wave everywhere, and long wave in Region 1 (ITU RR Article 5). Use broadcastBandAt to say which.
 */
export function inBroadcastBand(frequency: number, region: ItuRegion): boolean {
  return broadcastBandAt(frequency, region) !== null;
}

/** One harmonic of a drive frequency that lands in a broadcasting band. */
export interface BroadcastHarmonic {
  /** Harmonic number n (1 is the fundamental). */
  readonly harmonic: number;
  /** n × the drive frequency, Hz. */
  readonly frequency: number;
  /** The band it lands in. */
  readonly band: BroadcastBandName;
}

/**
 * How symmetric the drive waveform is. A symmetric square wave (push-pull, bridge) has odd
 * harmonics only; a single switch's waveform is not half-wave symmetric (its on and off halves
 * differ), so its even harmonics 2f, 4f … are there too.
 */
export type DriveSymmetry = "asymmetric" | "symmetric";

/**
 * Harmonics n ≤ maxHarmonic of a drive at `frequency` (Hz) that land in one of the region's
 * broadcasting bands; the fundamental (n = 1) is listed too when it is in a band. Every n for an
 * asymmetric drive (the default: the single-switch drivers this club builds), odd n only for a
 * symmetric one. Source: Fourier series — a waveform with half-wave symmetry f(t + T/2) = −f(t) has
 * no even harmonics, and any other periodic waveform generally has them (textbook; from memory).
 */
export function harmonicsInBroadcastBand(
  frequency: number,
  region: ItuRegion,
  maxHarmonic = 9,
  drive: DriveSymmetry = "asymmetric",
): BroadcastHarmonic[] {
  requirePositive("frequency", frequency);
  if (!Number.isInteger(maxHarmonic) || maxHarmonic < 1 || maxHarmonic > 999) {
    throw new CalcInputError("maxHarmonic", "a whole number from 1 to 999", maxHarmonic);
  }
  if (drive !== "asymmetric" && drive !== "symmetric") throw new CalcInputError("drive", "asymmetric or symmetric", drive);
  const step = drive === "symmetric" ? 2 : 1;
  const hits: BroadcastHarmonic[] = [];
  for (let n = 1; n <= maxHarmonic; n += step) {
    const band = broadcastBandAt(n * frequency, region);
    if (band) hits.push({ harmonic: n, frequency: n * frequency, band: band.name });
  }
  return hits;
}
