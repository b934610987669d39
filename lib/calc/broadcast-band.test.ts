import { describe, expect, it } from "vitest";
import { broadcastBand, broadcastBandAt, broadcastBands, harmonicsInBroadcastBand, inBroadcastBand, longWaveBroadcastBand, type ItuRegion } from "./broadcast-band";
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

  it("leaves typical secondary resonances of 300–500 kHz outside every region, and 200 kHz outside Regions 2 and 3", () => {
    // Lower medium-wave edges per ITU RR Art. 5 (above); Region 1's long wave ends at 283.5 kHz (below).
    for (const region of [1, 2, 3] as ItuRegion[]) {
      expect(inBroadcastBand(300e3, region)).toBe(false);
      expect(inBroadcastBand(500e3, region)).toBe(false);
    }
    expect(inBroadcastBand(200e3, 2)).toBe(false);
    expect(inBroadcastBand(200e3, 3)).toBe(false);
  });

  it("adds Region 1's long-wave band, 148.5–283.5 kHz with 9 kHz channels, where many tall secondaries resonate", () => {
    // ITU RR Article 5, LF broadcasting, Region 1 only (edges from memory; docs/references.md).
    expect(longWaveBroadcastBand(1)).toEqual({ lowerEdge: 148_500, upperEdge: 283_500, channelSpacing: 9_000 });
    expect(longWaveBroadcastBand(2)).toBeNull();
    expect(longWaveBroadcastBand(3)).toBeNull();
    expect(inBroadcastBand(148_499, 1)).toBe(false);
    expect(inBroadcastBand(148_500, 1)).toBe(true);
    expect(inBroadcastBand(200e3, 1)).toBe(true);
    expect(inBroadcastBand(283_500, 1)).toBe(true);
    expect(inBroadcastBand(283_501, 1)).toBe(false);
    expect(broadcastBandAt(200e3, 1)?.name).toBe("long-wave");
    expect(broadcastBandAt(1e6, 1)?.name).toBe("medium-wave");
    expect(broadcastBandAt(400e3, 1)).toBeNull();
    expect(broadcastBands(1).map((b) => b.name)).toEqual(["long-wave", "medium-wave"]);
    expect(broadcastBands(2).map((b) => b.name)).toEqual(["medium-wave"]);
    // the medium-wave accessor keeps its meaning for its callers
    expect(broadcastBand(1).lowerEdge).toBe(526_500);
  });

  it("lists the odd harmonics of a symmetric square-wave drive that land in a band", () => {
    // Odd-only harmonics of a half-wave-symmetric square wave (Fourier series); band edges per ITU RR Art. 5.
    // 321 kHz in Region 1: 3rd = 963 kHz and 5th = 1605 kHz are in, 7th = 2247 kHz is out.
    expect(harmonicsInBroadcastBand(321e3, 1, 9, "symmetric")).toEqual([
      { harmonic: 3, frequency: 963e3, band: "medium-wave" },
      { harmonic: 5, frequency: 1605e3, band: "medium-wave" },
    ]);
    // Region 2 reaches 1705 kHz, so the 5th of 340 kHz (1700 kHz) is in there but not in Region 1.
    expect(harmonicsInBroadcastBand(340e3, 2, 9, "symmetric").map((h) => h.harmonic)).toEqual([3, 5]);
    expect(harmonicsInBroadcastBand(340e3, 1, 9, "symmetric").map((h) => h.harmonic)).toEqual([3]);
    // A fundamental inside a band is reported as harmonic 1.
    expect(harmonicsInBroadcastBand(600e3, 1, 9, "symmetric")).toEqual([{ harmonic: 1, frequency: 600e3, band: "medium-wave" }]);
    // maxHarmonic limits the search: 9th of 100 kHz (900 kHz) is in, 11th … 15th (1.1–1.5 MHz) too when allowed;
    // in Region 2 the fundamental and 3rd (100, 300 kHz) are below every band.
    expect(harmonicsInBroadcastBand(100e3, 2, 9, "symmetric").map((h) => h.harmonic)).toEqual([7, 9]);
    expect(harmonicsInBroadcastBand(100e3, 2, 15, "symmetric").map((h) => h.harmonic)).toEqual([7, 9, 11, 13, 15]);
  });

  it("lists even harmonics too for a single switch's asymmetric drive (the default), in either band", () => {
    // Fourier series: only half-wave symmetry removes even harmonics; ITU RR Art. 5 band edges as above.
    // 321 kHz, Region 2: 642, 963, 1284, 1605 kHz (n = 2 … 5) are in 525–1705 kHz, 1926 kHz is out.
    expect(harmonicsInBroadcastBand(321e3, 2).map((h) => h.harmonic)).toEqual([2, 3, 4, 5]);
    // 100 kHz, Region 1: 200 kHz (n = 2) is long wave, 600 … 900 kHz (n = 6 … 9) medium wave; 300–500 kHz fall between.
    expect(harmonicsInBroadcastBand(100e3, 1)).toEqual([
      { harmonic: 2, frequency: 200e3, band: "long-wave" },
      { harmonic: 6, frequency: 600e3, band: "medium-wave" },
      { harmonic: 7, frequency: 700e3, band: "medium-wave" },
      { harmonic: 8, frequency: 800e3, band: "medium-wave" },
      { harmonic: 9, frequency: 900e3, band: "medium-wave" },
    ]);
  });

  it("refuses unknown regions and bad inputs", () => {
    expect(() => broadcastBand(4 as ItuRegion)).toThrow(/^region:/);
    expect(() => inBroadcastBand(-1, 1)).toThrow(/^frequency:/);
    expect(() => harmonicsInBroadcastBand(3e5, 1, 0)).toThrow(CalcInputError);
    expect(() => harmonicsInBroadcastBand(3e5, 1, 9, "lopsided" as "symmetric")).toThrow(/^drive:/);
    expect(() => broadcastBandAt(0, 1)).toThrow(/^frequency:/);
  });
});
