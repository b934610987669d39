"use client";

/**
 * The one chart component: chart.js line/scatter plots with linear or log axes, threshold lines and
 * markers, legible in print (no animation, fixed colours and dash patterns that survive greyscale).
 * Server components pass plain data; formatting is chosen by name because functions cannot cross
 * the server/client boundary. A data table in <details> gives the same figures to screen readers, and a
 * generated sentence (lib/units/chart-summary.ts) describes the chart (aria-describedby). Colours are read
 * from CSS custom properties, re-read when the colour scheme changes or the page is printed.
 */
import { useEffect, useId, useRef } from "react";
import type { AxisFormat } from "@/lib/units/axis-format";
import { formatAxisValue } from "@/lib/units/axis-format";
import { describeChart } from "@/lib/units/chart-summary";
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

export type { AxisFormat } from "@/lib/units/axis-format";
export { formatAxisValue } from "@/lib/units/axis-format";

export interface ChartSeries {
  label: string;
  points: { x: number; y: number }[];
  /** "line" joins the points; "points" shows markers only; "marker" shows large markers (e.g. resonances). */
  style?: "line" | "points" | "marker";
  /** A colour, or a CSS custom property reference such as "var(--chart-limit)" (follows light/dark/print). */
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

/** Series colours come from app/globals.css (--chart-1…6), so dark mode and print each get their own palette. */
const PALETTE = [1, 2, 3, 4, 5, 6].map((n) => `var(--chart-${n})`);
const DASHES = [[], [6, 4], [2, 3], [10, 3, 2, 3]];

/** Resolves "var(--name)" against the page's current custom properties; other colours pass through. */
function resolveColour(colour: string, style: CSSStyleDeclaration): string {
  const match = /^var\((--[\w-]+)\)$/.exec(colour.trim());
  if (!match) return colour;
  return style.getPropertyValue(match[1]!).trim() || "#000000";
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
  const summaryId = useId();

  useEffect(() => {
    if (!canvas.current) return;
    const datasets: ChartDataset<"line", { x: number; y: number }[]>[] = series.map((s) => {
      const style = s.style ?? "line";
      return {
        label: s.label,
        data: s.points,
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
    const element = canvas.current;
    // Paint with the palette in force now (light, dark, or print's light palette).
    const applyColours = () => {
      const style = getComputedStyle(element);
      chart.data.datasets.forEach((dataset, i) => {
        const colour = resolveColour(series[i]?.colour ?? PALETTE[i % PALETTE.length]!, style);
        dataset.borderColor = colour;
        dataset.backgroundColor = colour;
      });
      const ink = resolveColour("var(--ink)", style);
      const grid = resolveColour("var(--line)", style);
      for (const scale of [chart.options.scales?.x, chart.options.scales?.y]) {
        if (!scale) continue;
        scale.ticks = { ...scale.ticks, color: ink };
        scale.grid = { ...scale.grid, color: grid };
        if ("title" in scale && scale.title) scale.title.color = ink;
      }
      if (chart.options.plugins?.legend?.labels) chart.options.plugins.legend.labels.color = ink;
      chart.update("none");
    };
    applyColours();
    const schemeQuery = window.matchMedia("(prefers-color-scheme: dark)");
    const printQuery = window.matchMedia("print");
    schemeQuery.addEventListener("change", applyColours);
    printQuery.addEventListener("change", applyColours);
    // Re-render at print size (and in print's light palette) so the printed chart is sharp and fits the page.
    const beforePrint = () => {
      applyColours();
      chart.resize();
    };
    window.addEventListener("beforeprint", beforePrint);
    window.addEventListener("afterprint", applyColours);
    return () => {
      schemeQuery.removeEventListener("change", applyColours);
      printQuery.removeEventListener("change", applyColours);
      window.removeEventListener("beforeprint", beforePrint);
      window.removeEventListener("afterprint", applyColours);
      chart.destroy();
    };
  }, [series, x, y]);

  const summary = describeChart(title, series, x, y);
  const tableRows = series.flatMap((s) => (s.points.length <= 60 ? s.points.map((p) => ({ series: s.label, ...p })) : []));
  return (
    <figure className="chart" style={{ margin: "1rem 0" }}>
      <figcaption style={{ fontWeight: 600 }}>{title}</figcaption>
      <div style={{ position: "relative", height }}>
        <canvas ref={canvas} role="img" aria-label={`${title}: ${series.map((s) => s.label).join(", ")}`} aria-describedby={summaryId} />
      </div>
      <p id={summaryId} className="chart-summary">
        {summary}
      </p>
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
