/**
 * The medium-wave (AM) broadcasting allocation, to keep a coil's fundamental out of it and to show
 * which odd harmonics of a square-wave drive land in it (worth showing, not worth blocking).
 */
import { CalcInputError, requirePositive } from "./errors";

/** ITU region: 1 Europe/Africa/Middle East/former USSR, 2 the Americas, 3 Asia–Pacific. */
export type ItuRegion = 1 | 2 | 3;

/** Edges of the medium-wave broadcasting allocation and its channel spacing, all in Hz. */
export interface BroadcastBand {
  readonly lowerEdge: number;
  readonly upperEdge: number;
  readonly channelSpacing: number;
}

/**
 * ITU Radio Regulations Article 5 medium-wave broadcasting allocations.
 * Regions 1 and 3: 526.5–1606.5 kHz, 9 kHz channels (Geneva 1975 plan; confirmed).
 * Region 2: 525–1705 kHz, 10 kHz channels (525–535 kHz confirmed via RR 5.86; the 1605–1705 kHz
 * extension from memory; the US carriers 540–1700 kHz of 47 CFR §73.14 sit inside it).
 */
const BANDS: Readonly<Record<ItuRegion, BroadcastBand>> = {
  1: { lowerEdge: 526.5e3, upperEdge: 1606.5e3, channelSpacing: 9e3 },
  2: { lowerEdge: 525e3, upperEdge: 1705e3, channelSpacing: 10e3 },
  3: { lowerEdge: 526.5e3, upperEdge: 1606.5e3, channelSpacing: 9e3 },
};

function requireRegion(region: number): ItuRegion {
  if (region !== 1 && region !== 2 && region !== 3) throw new CalcInputError("region", "ITU region 1, 2 or 3", region);
  return region;
}

/** The medium-wave broadcasting band of an ITU region, Hz (ITU RR Article 5; see BANDS for what is confirmed). */
export function broadcastBand(region: ItuRegion): BroadcastBand {
  return BANDS[requireRegion(region)];
}

/** Whether `frequency` (Hz) lies in the region's medium-wave broadcasting band, edges included (ITU RR Article 5). */
export function inBroadcastBand(frequency: number, region: ItuRegion): boolean {
  requirePositive("frequency", frequency);
  const band = broadcastBand(region);
  return frequency >= band.lowerEdge && frequency <= band.upperEdge;
}

/** One harmonic of a drive frequency. */
export interface BroadcastHarmonic {
  /** Harmonic number n (1 is the fundamental). */
  readonly harmonic: number;
  /** n × the drive frequency, Hz. */
  readonly frequency: number;
}

/**
 * Odd harmonics n = 1, 3, 5, … ≤ maxHarmonic of a square-wave drive at `frequency` (Hz) that land in the
 * region's broadcasting band. A symmetric square wave carries only odd harmonics, at amplitudes 1/n of the
 * fundamental (Fourier series of a square wave); the fundamental (n = 1) is listed too when it is in the band.
 */
export function harmonicsInBroadcastBand(frequency: number, region: ItuRegion, maxHarmonic = 9): BroadcastHarmonic[] {
  requirePositive("frequency", frequency);
  if (!Number.isInteger(maxHarmonic) || maxHarmonic < 1 || maxHarmonic > 999) {
    throw new CalcInputError("maxHarmonic", "a whole number from 1 to 999", maxHarmonic);
  }
  const hits: BroadcastHarmonic[] = [];
  for (let n = 1; n <= maxHarmonic; n += 2) {
    if (inBroadcastBand(n * frequency, region)) hits.push({ harmonic: n, frequency: n * frequency });
  }
  return hits;
}
