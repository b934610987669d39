"use client";

/**
 * The one chart component: chart.js line/scatter plots with linear or log axes, threshold lines and
 * markers, legible in print (no animation, fixed colours and dash patterns that survive greyscale).
 * Server components pass plain data; formatting is chosen by name because functions cannot cross
 * the server/client boundary. A data table in <details> gives the same figures to screen readers.
 */
import { useEffect, useRef } from "react";
import {
  Chart,
  Legend,
  LineController,
  LineElement,
  LinearScale,
  LogarithmicScale,
  PointElement,
  ScatterController,
  Tooltip,
  type ChartDataset,
  type Scale,
} from "chart.js";
import { chooseAxisTicks, chooseTickUnit, formatTick, type TickQuantity } from "@/lib/units/axis-ticks";

Chart.register(LineController, ScatterController, LineElement, PointElement, LinearScale, LogarithmicScale, Tooltip, Legend);

export type AxisFormat = "number" | "frequency" | "date" | "duration" | "percent" | "ohms" | "celsius";

export interface ChartSeries {
  label: string;
  points: { x: number; y: number }[];
  /** "line" joins the points; "points" shows markers only; "marker" shows large markers (e.g. resonances). */
  style?: "line" | "points" | "marker";
  colour?: string;
  dashed?: boolean;
}

export interface LineChartProps {
  title: string;
  series: ChartSeries[];
  x: { label: string; format?: AxisFormat; log?: boolean };
  y: { label: string; format?: AxisFormat; log?: boolean; min?: number; max?: number };
  height?: number;
}

const PALETTE = ["#0b5cad", "#a3161b", "#1b6e3a", "#8a5a00", "#5b2c83", "#00727a"];
const DASHES = [[], [6, 4], [2, 3], [10, 3, 2, 3]];

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

const TICK_QUANTITY: Record<AxisFormat, TickQuantity | null> = {
  number: "plain",
  frequency: "frequency",
  ohms: "ohms",
  duration: "duration",
  percent: "percent",
  celsius: "celsius",
  date: null,
};

/**
 * Tick options for one axis: round values in one unit (lib/units/axis-ticks.ts) on linear axes; on log
 * axes chart.js keeps its decades and only the labels share one unit. Dates keep chart.js's own ticks.
 */
function axisTicks(format: AxisFormat = "number", log = false) {
  const quantity = TICK_QUANTITY[format];
  if (quantity === null) return { ticks: { callback: (v: string | number) => formatAxisValue(Number(v), format), maxTicksLimit: 8 } };
  return {
    afterBuildTicks: (scale: Scale) => {
      if (log || !(scale.max >= scale.min)) return;
      scale.ticks = chooseAxisTicks(scale.min, scale.max, quantity, 8).ticks.map((t) => ({ value: t.value }));
    },
    ticks: {
      callback(this: Scale, v: string | number) {
        return formatTick(Number(v), chooseTickUnit(Math.max(Math.abs(this.min), Math.abs(this.max)), quantity));
      },
      maxTicksLimit: 8,
    },
  };
}

export function LineChart({ title, series, x, y, height = 320 }: LineChartProps) {
  const canvas = useRef<HTMLCanvasElement>(null);

  useEffect(() => {
    if (!canvas.current) return;
    const datasets: ChartDataset<"line", { x: number; y: number }[]>[] = series.map((s, i) => {
      const colour = s.colour ?? PALETTE[i % PALETTE.length]!;
      const style = s.style ?? "line";
      return {
        label: s.label,
        data: s.points,
        borderColor: colour,
        backgroundColor: colour,
        borderDash: s.dashed ? [6, 4] : DASHES[0],
        showLine: style === "line",
        pointRadius: style === "marker" ? 6 : style === "points" ? 3 : 0,
        pointStyle: style === "marker" ? "triangle" : "circle",
        borderWidth: 2,
        tension: 0,
      };
    });
    const chart = new Chart(canvas.current, {
      type: "line",
      data: { datasets },
      // The drawn tick labels, mirrored on the canvas so a browser test can read what the axis says.
      plugins: [
        {
          id: "tick-labels",
          afterUpdate(drawn) {
            for (const axis of ["x", "y"] as const) drawn.canvas.dataset[`${axis}Ticks`] = (drawn.scales[axis]?.ticks ?? []).map((t) => String(t.label ?? "")).join(" | ");
          },
        },
      ],
      options: {
        animation: false,
        responsive: true,
        maintainAspectRatio: false,
        parsing: false,
        normalized: true,
        scales: {
          x: { type: x.log ? "logarithmic" : "linear", title: { display: true, text: x.label }, ...axisTicks(x.format, x.log) },
          y: { type: y.log ? "logarithmic" : "linear", min: y.min, max: y.max, title: { display: true, text: y.label }, ...axisTicks(y.format, y.log) },
        },
        plugins: {
          legend: { position: "bottom", labels: { usePointStyle: true } },
          tooltip: { callbacks: { label: (ctx) => `${ctx.dataset.label}: ${formatAxisValue(ctx.parsed.x ?? Number.NaN, x.format)}, ${formatAxisValue(ctx.parsed.y ?? Number.NaN, y.format)}` } },
        },
      },
    });
    // Re-render at print size so the printed chart is sharp and fits the page.
    const beforePrint = () => chart.resize();
    window.addEventListener("beforeprint", beforePrint);
    return () => {
      window.removeEventListener("beforeprint", beforePrint);
      chart.destroy();
    };
  }, [series, x, y]);

  const tableRows = series.flatMap((s) => (s.points.length <= 60 ? s.points.map((p) => ({ series: s.label, ...p })) : []));
  return (
    <figure className="chart" style={{ margin: "1rem 0" }}>
      <figcaption style={{ fontWeight: 600 }}>{title}</figcaption>
      <div style={{ position: "relative", height }}>
        <canvas ref={canvas} role="img" aria-label={`${title}: ${series.map((s) => s.label).join(", ")}`} />
      </div>
      {tableRows.length > 0 && (
        <details className="no-print">
          <summary>Figures as a table</summary>
          <table>
            <thead>
              <tr>
                <th scope="col">Series</th>
                <th scope="col">{x.label}</th>
                <th scope="col">{y.label}</th>
              </tr>
            </thead>
            <tbody>
              {tableRows.map((r, i) => (
                <tr key={i}>
                  <td>{r.series}</td>
                  <td>{formatAxisValue(r.x, x.format)}</td>
                  <td>{formatAxisValue(r.y, y.format)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </details>
      )}
    </figure>
  );
}
