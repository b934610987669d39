"use client";

/**
 * A wide table scrolls sideways inside its .table-wrap on a phone. A keyboard user can only scroll what can
 * take focus (WCAG 2.1.1; axe's scrollable-region-focusable), so every .table-wrap under <main> that actually
 * overflows becomes a named, focusable region; one that stops overflowing (wider screen) goes back to plain.
 * Done once here for every page rather than table by table. <main> carries data-scroll-regions="ready" after
 * the first pass, so tests know the marking has happened.
 */
import { useEffect } from "react";

const MARK = "scrollRegion";

function regionName(wrap: HTMLElement): string {
  const caption = wrap.querySelector("caption")?.textContent?.trim();
  const heading = wrap.closest("section")?.querySelector("h2, h3")?.textContent?.trim();
  const name = caption || heading;
  return name ? `${name} (table; scrolls sideways)` : "Table (scrolls sideways)";
}

function markScrollableTables(main: HTMLElement) {
  for (const wrap of main.querySelectorAll<HTMLElement>(".table-wrap")) {
    const overflows = wrap.scrollWidth > wrap.clientWidth + 1;
    if (overflows && wrap.tabIndex < 0) {
      wrap.tabIndex = 0;
      wrap.dataset[MARK] = "true";
      if (!wrap.hasAttribute("role")) wrap.setAttribute("role", "region");
      if (!wrap.hasAttribute("aria-label") && !wrap.hasAttribute("aria-labelledby")) wrap.setAttribute("aria-label", regionName(wrap));
    } else if (!overflows && wrap.dataset[MARK]) {
      wrap.removeAttribute("tabindex");
      wrap.removeAttribute("role");
      wrap.removeAttribute("aria-label");
      delete wrap.dataset[MARK];
    }
  }
  main.dataset.scrollRegions = "ready";
}

export function ScrollableRegions() {
  useEffect(() => {
    const main = document.getElementById("main");
    if (!main) return;
    const mark = () => markScrollableTables(main);
    mark();
    const resizes = new ResizeObserver(mark);
    resizes.observe(main);
    // New page content (client navigation, a form's result) may bring new tables: child changes only, so the
    // attributes set here do not wake the observer again.
    const changes = new MutationObserver(mark);
    changes.observe(main, { childList: true, subtree: true });
    return () => {
      resizes.disconnect();
      changes.disconnect();
    };
  }, []);
  return null;
}
