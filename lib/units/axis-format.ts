/**
 * How a chart axis value reads in text: tick labels, tooltips, the figures table and the chart's
 * described summary all use these, so a screen reader hears what a sighted reader sees.
 */
export type AxisFormat = "number" | "frequency" | "date" | "duration" | "percent" | "ohms" | "celsius";

export function formatAxisValue(value: number, format: AxisFormat = "number"): string {
  if (!Number.isFinite(value)) return "—";
  switch (format) {
    case "frequency":
      return value >= 1e6 ? `${+(value / 1e6).toPrecision(3)} MHz` : value >= 1e3 ? `${+(value / 1e3).toPrecision(3)} kHz` : `${+value.toPrecision(3)} Hz`;
    case "ohms":
      return value >= 1e6 ? `${+(value / 1e6).toPrecision(3)} MΩ` : value >= 1e3 ? `${+(value / 1e3).toPrecision(3)} kΩ` : `${+value.toPrecision(3)} Ω`;
    case "date":
      return new Date(value).toISOString().slice(0, 10);
    case "duration":
      return value >= 120 ? `${+(value / 60).toFixed(1)} min` : `${Math.round(value)} s`;
    case "percent":
      return `${Math.round(value * 100)} %`;
    case "celsius":
      return `${+value.toFixed(1)} °C`;
    default:
      return `${+value.toPrecision(4)}`;
  }
}
