/**
 * The demo sheet on the page: a grid of cells with a name box and a contents
 * bar, operable by mouse and keyboard, showing what the workbook calculates
 * under each cell's number format; sheet tabs; and the charts the workbook
 * recorded, drawn below the grid.
 *
 * Method: the grid is an HTML table drawn from the workbook after every
 * change, but only the rows in view and a margin around them (virtual
 * scrolling): spacer rows stand for the rest, so the scroll bar spans the
 * whole sheet while 100,000 rows cost no more to draw than 100. Each drawn
 * cell keeps its id (demo-cell-ROW-COLUMN) and the grid's
 * aria-activedescendant names the active one; moving the active cell
 * (arrows, the name box, the pane's selection) scrolls it into view first.
 * Cell text as text nodes only.
 *
 * Keyboard: arrows move, Shift+arrows extend the selection, Ctrl+arrows go to
 * the edge of the data region (dataEdge.ts), typing starts an entry in the
 * contents bar, Enter there commits and moves down, Escape cancels, F2 edits,
 * Delete clears the selection; Tab leaves the grid for the pane. Pasting text
 * (Ctrl+V) fills cells from the active one, one line per row and one
 * tab-separated field per cell (clipboard.ts), and selects them. Typing or
 * pasting below a table lengthens it, as in the spreadsheet. An entry Excel
 * would not take (see limits.ts) is refused with the reason, and the contents
 * bar keeps it for correcting, as Excel keeps a formula it cannot accept in
 * edit mode.
 *
 * Cost: O(drawn cells) per change and per scroll past the drawn rows.
 */
import { columnLetters, formatAddress, LAST_COLUMN, LAST_ROW, parseAddress, type CellRect } from "../taskpane/a1";
import { el, replaceChildren, svg } from "../taskpane/dom";
import { formatCell } from "../taskpane/numberFormat";
import { DRAWING, scatterDrawing } from "./scatterDrawing";
import { clipboardCells } from "./clipboard";
import { dataEdge } from "./dataEdge";
import { isError } from "./formula/values";
import { RefusedEntry } from "./limits";
import type { ChartModel, Workbook } from "./workbook";

const MIN_ROWS = 32;
const MIN_COLUMNS = 12;
const DEFAULT_WIDTH = 84;
const ROW_HEADER_WIDTH = 40;
/** A first guess of a row's height in pixels (demo.css); the grid measures the real one once drawn. */
const DEFAULT_ROW_HEIGHT = 22;
/** Rows drawn beyond those in view on either side, so that scrolling a little needs no drawing. */
const OVERSCAN = 20;
/** At least this many rows are drawn, so that a short sheet area still shows whole. */
const MIN_WINDOW = 100;

interface Cursor {
  row: number;
  column: number;
}

function shownText(workbook: Workbook, sheet: string, row: number, column: number): { text: string; error?: string; numeric: boolean } {
  const value = workbook.value(sheet, row, column);
  if (isError(value)) return { text: value.code, error: value.message, numeric: false };
  return { text: formatCell(value, workbook.format(sheet, row, column).numberFormat), numeric: typeof value === "number" };
}

/** A number for an axis label: short, without trailing zeros. */
function tickText(value: number): string {
  return Number(value.toPrecision(6)).toLocaleString("en-US", { maximumFractionDigits: 6 });
}

/** The recorded scatter chart, drawn by the demo from the cells it reads (scatterDrawing.ts). */
function chartView(workbook: Workbook, chart: ChartModel, clipId: string): HTMLElement {
  const drawing = scatterDrawing(chart, (link) => workbook.values(link.sheet, workbook.linkedRect(link)));
  const { width, height, left, right, top, bottom } = DRAWING;
  const plotRight = width - right;
  const plotBottom = height - bottom;
  const across = (v: number): number => left + ((v - drawing.x.minimum) / (drawing.x.maximum - drawing.x.minimum)) * (plotRight - left);
  const up = (v: number): number => plotBottom - ((v - drawing.y.minimum) / (drawing.y.maximum - drawing.y.minimum)) * (plotBottom - top);
  const points = drawing.series.find((s) => s.kind === "points");
  const plot = svg("svg", {
    class: "demo-chart-plot",
    attrs: {
      viewBox: `0 0 ${width} ${height}`,
      role: "img",
      "aria-label": `Scatter chart: ${drawing.series.map((s) => `${s.name} (${s.count} ${s.kind === "points" ? "points" : "line ends"})`).join(", ")}`,
    },
  });
  plot.appendChild(svg("rect", { class: "demo-chart-area", attrs: { x: "0", y: "0", width: String(width), height: String(height) } }));
  plot.appendChild(
    svg(
      "clipPath",
      { id: clipId },
      svg("rect", { attrs: { x: String(left), y: String(top), width: String(plotRight - left), height: String(plotBottom - top) } }),
    ),
  );
  for (const tick of drawing.y.ticks) {
    const y = up(tick).toFixed(1);
    plot.appendChild(svg("line", { class: "demo-chart-grid", attrs: { x1: String(left), x2: String(plotRight), y1: y, y2: y } }));
    plot.appendChild(
      svg("text", { class: "demo-chart-tick", attrs: { x: String(left - 4), y, "text-anchor": "end", dy: "0.32em" } }, tickText(tick)),
    );
  }
  for (const tick of drawing.x.ticks) {
    const x = across(tick).toFixed(1);
    plot.appendChild(
      svg("text", { class: "demo-chart-tick", attrs: { x, y: String(plotBottom + 12), "text-anchor": "middle" } }, tickText(tick)),
    );
  }
  plot.appendChild(
    svg("polyline", {
      class: "demo-chart-axis",
      attrs: { points: `${left},${top} ${left},${plotBottom} ${plotRight},${plotBottom}`, fill: "none" },
    }),
  );
  plot.appendChild(
    svg(
      "text",
      { class: "demo-chart-title", attrs: { x: String((left + plotRight) / 2), y: String(height - 6), "text-anchor": "middle" } },
      drawing.x.title,
    ),
  );
  plot.appendChild(
    svg(
      "text",
      {
        class: "demo-chart-title",
        attrs: {
          x: "10",
          y: String((top + plotBottom) / 2),
          "text-anchor": "middle",
          transform: `rotate(-90 10 ${(top + plotBottom) / 2})`,
        },
      },
      drawing.y.title,
    ),
  );
  const clipped = svg("g", { attrs: { "clip-path": `url(#${clipId})` } });
  drawing.series.forEach((s, i) => {
    const colour = s.colour ?? (i === 0 ? "#3D5A80" : "#555555");
    if (s.kind === "line") {
      clipped.appendChild(
        svg("polyline", {
          class: "demo-chart-line",
          attrs: {
            points: s.positions.map((p) => p.join(",")).join(" "),
            fill: "none",
            stroke: colour,
            "stroke-width": "1.5",
            ...(s.dashed ? { "stroke-dasharray": "5 3" } : {}),
          },
        }),
      );
    } else {
      for (const [x, y] of s.positions)
        clipped.appendChild(svg("circle", { class: "demo-chart-point", attrs: { cx: String(x), cy: String(y), r: "2.5", fill: colour } }));
    }
  });
  plot.appendChild(clipped);
  const keys = drawing.series.map((s, i) =>
    el(
      "span",
      { class: "demo-key" },
      svg(
        "svg",
        { class: "demo-key-mark", attrs: { viewBox: "0 0 16 8", "aria-hidden": "true" } },
        s.kind === "line"
          ? svg("line", {
              attrs: {
                x1: "0",
                x2: "16",
                y1: "4",
                y2: "4",
                stroke: s.colour ?? "#555555",
                "stroke-width": "2",
                ...(s.dashed ? { "stroke-dasharray": "4 2" } : {}),
              },
            })
          : svg("circle", { attrs: { cx: "8", cy: "4", r: "3", fill: s.colour ?? (i === 0 ? "#3D5A80" : "#555555") } }),
      ),
      s.name,
    ),
  );
  const outside =
    points && points.outside > 0
      ? ` ${points.outside.toLocaleString("en-US")} of its values lie outside the axes and are not drawn (text counts as 0 in a scatter chart).`
      : "";
  const merged =
    points && points.positions.length < points.count - points.outside ? " Points on the same spot of this drawing are drawn once." : "";
  return el(
    "figure",
    { class: "demo-chart" },
    el(
      "figcaption",
      undefined,
      el("strong", undefined, chart.title || "Chart"),
      ` — the demo’s drawing of the chart the workbook records (${chart.type}, which Excel would float over ${chart.from}:${chart.to}), read from the same cells, so it follows them.${outside}${merged}`,
    ),
    // The chart's own white area holds the plot and its legend, as Excel draws a new chart, in either theme.
    el("div", { class: "demo-chart-sheet" }, plot, el("p", { class: "demo-legend" }, ...keys)),
  );
}

/**
 * Shows the workbook's sheets in `container`, one at a time (the one holding
 * the selection; the tabs below switch), and keeps it up to date.
 *
 * @example
 * mountGrid(document.getElementById("sheet")!, workbook);
 */
export function mountGrid(container: HTMLElement, workbook: Workbook): void {
  let sheet = workbook.selection.sheet;
  let active: Cursor = { row: 0, column: 0 };
  let anchor: Cursor = { row: 0, column: 0 };
  let dragging = false;

  const nameBox = el("input", {
    class: "demo-namebox",
    attrs: { type: "text", "aria-label": "Selected cells (type an address and press Enter)", spellcheck: "false" },
  });
  const contents = el("input", {
    class: "demo-contents",
    attrs: { type: "text", "aria-label": "Contents of the active cell (Enter saves, Escape cancels)", spellcheck: "false" },
  });
  const head = el("thead");
  const body = el("tbody");
  const grid = el("table", { class: "demo-grid", attrs: { role: "grid", tabindex: "0", "aria-multiselectable": "true" } }, head, body);
  const tabs = el("p", { class: "demo-tab", attrs: { role: "group", "aria-label": "Sheets" } });
  const wrap = el("div", { class: "demo-grid-wrap" }, grid);
  const charts = el("section", { class: "demo-charts", attrs: { "aria-label": "Charts in the sheet" } });
  const refusal = el("p", { class: "demo-problem", attrs: { role: "alert" } });
  replaceChildren(
    container,
    el("div", { class: "demo-bar" }, nameBox, el("span", { class: "demo-fx", attrs: { "aria-hidden": "true" } }, "fx"), contents),
    refusal,
    wrap,
    tabs,
    charts,
  );

  const rect = (): CellRect => ({
    top: Math.min(anchor.row, active.row),
    bottom: Math.max(anchor.row, active.row),
    left: Math.min(anchor.column, active.column),
    right: Math.max(anchor.column, active.column),
  });
  const cellId = (r: number, c: number): string => `demo-cell-${r}-${c}`;

  const select = (): void => workbook.select({ sheet, rect: rect() });

  function renderTabs(): void {
    replaceChildren(
      tabs,
      ...workbook.sheetNames.map((name) => {
        const tab = el("button", { class: "demo-tab-button", attrs: { type: "button", "aria-pressed": String(name === sheet) } }, name);
        tab.addEventListener("click", () => {
          if (name === sheet) return;
          anchor = active = { row: 0, column: 0 };
          workbook.select({ sheet: name, rect: { top: 0, left: 0, bottom: 0, right: 0 } });
        });
        return tab;
      }),
    );
  }

  /** What the last render showed: the body is drawn from it again as the sheet scrolls. */
  let view = { rows: MIN_ROWS, columns: MIN_COLUMNS, selection: workbook.selection.rect };
  let drawn = { first: -1, last: -1 };
  let rowHeight = DEFAULT_ROW_HEIGHT;
  let shownActive = "";

  /** The rows to draw for the current scroll position: those in view and OVERSCAN more on either side. */
  function rowWindow(): { first: number; last: number } {
    const count = Math.max(MIN_WINDOW, Math.ceil(wrap.clientHeight / rowHeight) + 2 * OVERSCAN);
    const last = Math.min(view.rows - 1, Math.max(0, Math.floor(wrap.scrollTop / rowHeight) - OVERSCAN) + count - 1);
    return { first: Math.max(0, last - count + 1), last };
  }

  /** Scrolls the sheet (not the page) so that `row` is in view below the sticky header. */
  function keepRowInView(row: number): void {
    const header = head.offsetHeight;
    const top = header + row * rowHeight;
    if (top < wrap.scrollTop + header) wrap.scrollTop = top - header;
    else if (top + rowHeight > wrap.scrollTop + wrap.clientHeight) wrap.scrollTop = top + rowHeight - wrap.clientHeight;
  }

  function spacer(height: number): HTMLElement {
    const td = el("td", { class: "demo-spacer", attrs: { colspan: String(view.columns + 1) } });
    td.style.height = `${height}px`;
    return el("tr", { attrs: { "aria-hidden": "true" } }, td);
  }

  function cellView(r: number, c: number, tables: readonly { rect: CellRect }[]): HTMLElement {
    const { selection } = view;
    const shown = shownText(workbook, sheet, r, c);
    const format = workbook.format(sheet, r, c);
    const inSelection = r >= selection.top && r <= selection.bottom && c >= selection.left && c <= selection.right;
    const classes = ["demo-cell"];
    if (shown.numeric) classes.push("demo-num");
    if (format.bold) classes.push("demo-bold");
    if (format.italic) classes.push("demo-italic");
    if (inSelection) classes.push("demo-selected");
    if (r === active.row && c === active.column) classes.push("demo-active");
    const table = tables.find((t) => r >= t.rect.top && r <= t.rect.bottom && c >= t.rect.left && c <= t.rect.right);
    if (table) classes.push(r === table.rect.top ? "demo-table-header" : "demo-table-body");
    if (shown.error) classes.push("demo-error");
    // Text runs on over empty neighbours to its right, as in the spreadsheet.
    if (!shown.numeric && shown.text !== "" && workbook.value(sheet, r, c + 1) === null) classes.push("demo-overflow");
    const td = el(
      "td",
      {
        class: classes.join(" "),
        id: cellId(r, c),
        attrs: { role: "gridcell", "aria-selected": inSelection ? "true" : "false", "data-row": String(r), "data-column": String(c) },
      },
      shown.text,
    );
    if (shown.error) td.setAttribute("title", shown.error);
    if (format.color) td.style.color = format.color;
    return td;
  }

  /** Draws the rows in view (with spacers standing for the rows above and below), never the whole sheet. */
  function drawBody(): void {
    const { first, last } = (drawn = rowWindow());
    const tables = workbook.tables.filter((t) => t.sheet === sheet);
    const rowsOut: HTMLElement[] = [spacer(first * rowHeight)];
    for (let r = first; r <= last; r++) {
      const tr = el("tr", { attrs: { "aria-rowindex": String(r + 2) } }, el("th", { attrs: { scope: "row" } }, String(r + 1)));
      for (let c = 0; c < view.columns; c++) tr.appendChild(cellView(r, c, tables));
      rowsOut.push(tr);
    }
    rowsOut.push(spacer((view.rows - 1 - last) * rowHeight));
    replaceChildren(body, ...rowsOut);
    // Rows are as high as the style makes them; measure once drawn, and draw again if the guess was off.
    const measured = (rowsOut[1] as HTMLElement | undefined)?.getBoundingClientRect().height ?? 0;
    if (measured > 0 && Math.abs(measured - rowHeight) > 0.5) {
      rowHeight = measured;
      drawBody();
    }
  }

  function render(): void {
    const shownSheet = workbook.selection.sheet;
    if (shownSheet !== sheet) {
      sheet = shownSheet;
      renderTabs();
    }
    grid.setAttribute("aria-label", `Sheet ${sheet}`);
    const used = workbook.usedRect(sheet);
    const selection = workbook.selection.rect;
    const mine = rect();
    if (selection.top !== mine.top || selection.left !== mine.left || selection.bottom !== mine.bottom || selection.right !== mine.right) {
      // Someone else (the pane) selected cells: follow them.
      active = { row: selection.top, column: selection.left };
      anchor = { row: selection.bottom, column: selection.right };
    }
    const rows = Math.max(MIN_ROWS, (used?.bottom ?? 0) + 6, selection.bottom + 2);
    const columns = Math.max(MIN_COLUMNS, (used?.right ?? 0) + 3, selection.right + 2);
    view = { rows, columns, selection };
    const widths = Array.from({ length: columns }, (_, c) => workbook.columnWidth(sheet, c) ?? DEFAULT_WIDTH);
    replaceChildren(
      head,
      el(
        "tr",
        { attrs: { "aria-rowindex": "1" } },
        el("th", { class: "demo-corner", attrs: { scope: "col" } }),
        ...widths.map((width, c) => {
          const th = el("th", { attrs: { scope: "col" } }, columnLetters(c));
          th.style.width = `${width}px`;
          return th;
        }),
      ),
    );
    // A fixed layout needs a definite width: then the columns keep their widths, as a sheet's do.
    grid.style.width = `${ROW_HEADER_WIDTH + widths.reduce((sum, w) => sum + w, 0)}px`;
    grid.setAttribute("aria-rowcount", String(rows + 1));
    grid.setAttribute("aria-colcount", String(columns + 1));
    const activeKey = `${sheet}!${active.row},${active.column}`;
    const moved = activeKey !== shownActive;
    shownActive = activeKey;
    if (moved) keepRowInView(active.row);
    drawBody();
    grid.setAttribute("aria-activedescendant", cellId(active.row, active.column));
    nameBox.value = formatAddress(selection);
    if (document.activeElement !== contents) contents.value = String(workbook.entry(sheet, active.row, active.column));
    replaceChildren(
      charts,
      ...workbook.charts.filter((c) => c.sheet === sheet).map((c, i) => chartView(workbook, c, `demo-chart-clip-${i}`)),
    );
    if (moved) document.getElementById(cellId(active.row, active.column))?.scrollIntoView({ block: "nearest", inline: "nearest" });
  }

  wrap.addEventListener("scroll", () => {
    // Draw again only once the rows in view reach past the drawn ones.
    const top = Math.floor(wrap.scrollTop / rowHeight);
    const bottom = Math.ceil((wrap.scrollTop + wrap.clientHeight) / rowHeight);
    if (top < drawn.first || (bottom > drawn.last && drawn.last < view.rows - 1)) drawBody();
  });

  function moveTo(row: number, column: number, extend: boolean): void {
    active = { row: Math.max(0, row), column: Math.max(0, column) };
    if (!extend) anchor = { ...active };
    select();
  }

  /** Enters the contents bar into the active cell; false (with the reason shown) when the sheet refuses it. */
  function commit(): boolean {
    try {
      workbook.writeEntries(sheet, active.row, active.column, [[contents.value]], true);
    } catch (thrown) {
      if (!(thrown instanceof RefusedEntry)) throw thrown;
      refusal.textContent = thrown.message;
      contents.setAttribute("aria-invalid", "true");
      return false;
    }
    refusal.textContent = "";
    contents.removeAttribute("aria-invalid");
    return true;
  }

  grid.addEventListener("keydown", (event) => {
    const moves: Record<string, [number, number]> = { ArrowUp: [-1, 0], ArrowDown: [1, 0], ArrowLeft: [0, -1], ArrowRight: [0, 1] };
    const move = moves[event.key];
    if (move && (event.ctrlKey || event.metaKey)) {
      // Ctrl+arrow: to the edge of the data region (dataEdge.ts), so the end of 100,000 rows is one key away.
      event.preventDefault();
      const used = workbook.usedRect(sheet);
      const vertical = move[0] !== 0;
      const step = (vertical ? move[0] : move[1]) as 1 | -1;
      const line = vertical
        ? { lastUsed: used?.bottom ?? -1, last: LAST_ROW, filled: (r: number) => workbook.value(sheet, r, active.column) !== null }
        : { lastUsed: used?.right ?? -1, last: LAST_COLUMN, filled: (c: number) => workbook.value(sheet, active.row, c) !== null };
      const to = dataEdge(vertical ? active.row : active.column, step, line);
      moveTo(vertical ? to : active.row, vertical ? active.column : to, event.shiftKey);
      return;
    }
    if (move) {
      event.preventDefault();
      moveTo(active.row + move[0], active.column + move[1], event.shiftKey);
      return;
    }
    if (event.key === "Enter" || event.key === "F2") {
      event.preventDefault();
      contents.focus();
      contents.setSelectionRange(contents.value.length, contents.value.length);
      return;
    }
    if (event.key === "Delete" || event.key === "Backspace") {
      event.preventDefault();
      const r = rect();
      const blanks = Array.from({ length: r.bottom - r.top + 1 }, () => Array.from({ length: r.right - r.left + 1 }, () => ""));
      workbook.writeEntries(sheet, r.top, r.left, blanks);
      return;
    }
    if (event.key.length === 1 && !event.ctrlKey && !event.metaKey && !event.altKey) {
      event.preventDefault();
      contents.value = event.key;
      contents.focus();
    }
  });

  contents.addEventListener("keydown", (event) => {
    if (event.key === "Enter") {
      event.preventDefault();
      if (!commit()) return;
      grid.focus();
      moveTo(active.row + 1, active.column, false);
    } else if (event.key === "Escape") {
      event.preventDefault();
      refusal.textContent = "";
      contents.removeAttribute("aria-invalid");
      contents.value = String(workbook.entry(sheet, active.row, active.column));
      grid.focus();
    }
  });

  nameBox.addEventListener("keydown", (event) => {
    if (event.key !== "Enter") return;
    event.preventDefault();
    const parsed = parseAddress(nameBox.value);
    if (!parsed || (parsed.sheet !== undefined && parsed.sheet.toLowerCase() !== sheet.toLowerCase())) {
      nameBox.setAttribute("aria-invalid", "true");
      return;
    }
    nameBox.removeAttribute("aria-invalid");
    anchor = { row: parsed.bottom, column: parsed.right };
    active = { row: parsed.top, column: parsed.left };
    select();
    grid.focus();
  });

  const cellAt = (target: EventTarget | null): Cursor | null => {
    const td = (target as HTMLElement | null)?.closest?.("td[data-row]");
    return td ? { row: Number(td.getAttribute("data-row")), column: Number(td.getAttribute("data-column")) } : null;
  };
  grid.addEventListener("mousedown", (event) => {
    const cell = cellAt(event.target);
    if (!cell) return;
    event.preventDefault();
    grid.focus();
    dragging = true;
    if (event.shiftKey) active = cell;
    else anchor = active = cell;
    select();
  });
  grid.addEventListener("mouseover", (event) => {
    if (!dragging) return;
    const cell = cellAt(event.target);
    if (cell && (cell.row !== active.row || cell.column !== active.column)) {
      active = cell;
      select();
    }
  });
  document.addEventListener("mouseup", () => {
    dragging = false;
  });
  grid.addEventListener("dblclick", () => contents.focus());

  // Excel pastes plain text from the active cell on, one line per row and one tab-separated field per cell.
  grid.addEventListener("paste", (event) => {
    const text = event.clipboardData?.getData("text/plain") ?? "";
    const cells = clipboardCells(text);
    if (cells.length === 0) return;
    event.preventDefault();
    const width = Math.max(...cells.map((row) => row.length));
    // A short row leaves the cells to its right as they are (null), as a ragged paste has nothing for them.
    const entries = cells.map((row) => (row.length < width ? [...row, ...Array<null>(width - row.length).fill(null)] : row));
    try {
      workbook.writeEntries(sheet, active.row, active.column, entries, true);
    } catch (thrown) {
      if (!(thrown instanceof RefusedEntry)) throw thrown;
      refusal.textContent = `Nothing was pasted. ${thrown.message}`;
      return;
    }
    refusal.textContent = "";
    anchor = { row: active.row + entries.length - 1, column: active.column + width - 1 };
    select();
  });

  workbook.onChange(render);
  renderTabs();
  render();
}
