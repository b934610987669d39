import { describe, expect, it } from "vitest";
import { broadcastBand, harmonicsInBroadcastBand, inBroadcastBand, type ItuRegion } from "./broadcast-band";
import { CalcInputError } from "./errors";

describe("medium-wave broadcasting band", () => {
  it("runs 526.5–1606.5 kHz with 9 kHz channels in Regions 1 and 3", () => {
    // ITU Radio Regulations Art. 5, Geneva 1975 plan (docs/references.md, confirmed).
    for (const region of [1, 3] as const) {
      expect(broadcastBand(region)).toEqual({ lowerEdge: 526_500, upperEdge: 1_606_500, channelSpacing: 9_000 });
      expect(inBroadcastBand(526_499, region)).toBe(false);
      expect(inBroadcastBand(526_500, region)).toBe(true);
      expect(inBroadcastBand(1_606_500, region)).toBe(true);
      expect(inBroadcastBand(1_606_501, region)).toBe(false);
      expect(inBroadcastBand(1_700_000, region)).toBe(false);
    }
  });

  it("runs 525–1705 kHz with 10 kHz channels in Region 2", () => {
    // ITU RR Art. 5: lower edge 525 kHz confirmed via RR 5.86; upper edge 1705 kHz from memory.
    expect(broadcastBand(2)).toEqual({ lowerEdge: 525_000, upperEdge: 1_705_000, channelSpacing: 10_000 });
    expect(inBroadcastBand(524_999, 2)).toBe(false);
    expect(inBroadcastBand(525_000, 2)).toBe(true);
    expect(inBroadcastBand(1_705_000, 2)).toBe(true);
    expect(inBroadcastBand(1_705_001, 2)).toBe(false);
  });

  it("covers every US AM carrier from 540 to 1700 kHz in Region 2", () => {
    // 47 CFR §73.14: 117 carriers, 540–1700 kHz in 10 kHz steps (docs/references.md, confirmed).
    let count = 0;
    for (let carrier = 540_000; carrier <= 1_700_000; carrier += 10_000) {
      expect(inBroadcastBand(carrier, 2)).toBe(true);
      count += 1;
    }
    expect(count).toBe(117);
  });

  it("leaves typical secondary resonances of 200–500 kHz outside every region", () => {
    // Lower edges per ITU RR Art. 5 (above).
    for (const region of [1, 2, 3] as ItuRegion[]) {
      expect(inBroadcastBand(200e3, region)).toBe(false);
      expect(inBroadcastBand(500e3, region)).toBe(false);
    }
  });

  it("lists the odd harmonics of a square-wave drive that land in the band", () => {
    // Odd-only harmonics of a symmetric square wave (Fourier series); band edges per ITU RR Art. 5.
    // 321 kHz in Region 1: 3rd = 963 kHz and 5th = 1605 kHz are in, 7th = 2247 kHz is out.
    expect(harmonicsInBroadcastBand(321e3, 1)).toEqual([
      { harmonic: 3, frequency: 963e3 },
      { harmonic: 5, frequency: 1605e3 },
    ]);
    // Region 2 reaches 1705 kHz, so the 5th of 340 kHz (1700 kHz) is in there but not in Region 1.
    expect(harmonicsInBroadcastBand(340e3, 2).map((h) => h.harmonic)).toEqual([3, 5]);
    expect(harmonicsInBroadcastBand(340e3, 1).map((h) => h.harmonic)).toEqual([3]);
    // A fundamental inside the band is reported as harmonic 1.
    expect(harmonicsInBroadcastBand(600e3, 1)).toEqual([{ harmonic: 1, frequency: 600e3 }]);
    // maxHarmonic limits the search: 9th of 100 kHz (900 kHz) is in, 11th … 15th (1.1–1.5 MHz) too when allowed.
    expect(harmonicsInBroadcastBand(100e3, 1).map((h) => h.harmonic)).toEqual([7, 9]);
    expect(harmonicsInBroadcastBand(100e3, 1, 15).map((h) => h.harmonic)).toEqual([7, 9, 11, 13, 15]);
  });

  it("refuses unknown regions and bad inputs", () => {
    expect(() => broadcastBand(4 as ItuRegion)).toThrow(/^region:/);
    expect(() => inBroadcastBand(-1, 1)).toThrow(/^frequency:/);
    expect(() => harmonicsInBroadcastBand(3e5, 1, 0)).toThrow(CalcInputError);
  });
});
