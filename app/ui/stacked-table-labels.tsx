"use client";

/**
 * Wide tables on phones: below 640 px every table in a .table-wrap is shown as stacked cards (one row a
 * card, one cell a line), and each cell needs its column's heading beside it. This labels every data
 * cell with data-label from its column header (colspans counted) so the stylesheet can print the heading
 * before the value; one mechanism for every table, including ones added later. Tables marked
 * .keep-grid (the sweep reading grid, where the columns are the point) keep their grid.
 */
import { useEffect } from "react";

function labelTable(table: HTMLTableElement) {
  const headerRow = table.tHead?.rows[table.tHead.rows.length - 1];
  if (!headerRow) return;
  const headings: string[] = [];
  for (const cell of Array.from(headerRow.cells)) {
    const text = (cell.textContent ?? "").trim();
    for (let i = 0; i < cell.colSpan; i++) headings.push(text);
  }
  for (const body of Array.from(table.tBodies)) {
    for (const row of Array.from(body.rows)) {
      let column = 0;
      for (const cell of Array.from(row.cells)) {
        const heading = headings[column] ?? "";
        if (cell.getAttribute("data-label") !== heading) cell.setAttribute("data-label", heading);
        column += cell.colSpan;
      }
    }
  }
}

function labelAll() {
  document.querySelectorAll<HTMLTableElement>(".table-wrap table:not(.keep-grid)").forEach(labelTable);
}

export function StackedTableLabels() {
  useEffect(() => {
    labelAll();
    // Client navigation and client-rendered tables (the planner's comparison) add tables after the first paint.
    const observer = new MutationObserver(() => labelAll());
    observer.observe(document.body, { childList: true, subtree: true });
    return () => observer.disconnect();
  }, []);
  return null;
}
