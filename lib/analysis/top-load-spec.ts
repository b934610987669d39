/**
 * The one mapping from a stored top load to lib/calc's TopLoadSpec, used by the coil page, the sweep page,
 * the calibration and the fleet's prediction quality alike: a capacitance measured on the top load itself
 * wins over the free-space formula of its shape (it is a measurement of the part, not of the coil), then the
 * shape's free-space value when its dimensions are recorded. Null for a bare coil, "none", or a row missing
 * what its shape needs.
 */
import type { TopLoadSpec } from "../calc/build-prediction";
import type { TopLoadRecord } from "./records";

export function topLoadSpecOf(topLoad: Omit<TopLoadRecord, "id"> | null | undefined): TopLoadSpec | null {
  if (!topLoad || topLoad.shape === "none") return null;
  const { shape, diameterM, tubeDiameterM, heightM, measuredCapacitanceF } = topLoad;
  if (measuredCapacitanceF !== null) return { capacitance: measuredCapacitanceF };
  switch (shape) {
    case "sphere":
    case "disc":
      return diameterM === null ? null : { kind: shape, diameter: diameterM };
    case "toroid":
      return diameterM === null || tubeDiameterM === null ? null : { kind: "toroid", outerDiameter: diameterM, tubeDiameter: tubeDiameterM };
    case "cylinder":
      return diameterM === null || heightM === null ? null : { kind: "cylinder", diameter: diameterM, height: heightM };
    default:
      return null;
  }
}
