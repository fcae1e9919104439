/**
 * Entry of demo.html: the Evensplit pane beside an in-page sheet holding
 * invented data, for trying the add-in where Excel is not installed.
 *
 * Start-up: install the custom-functions stand-in, load the real cell
 * function bundle (functions.js) and its metadata (functions.json, same
 * origin), fill the workbook with the invented data (demoWorkbook.ts), then show the sheet and
 * mount the pane on a host built from the demo's Excel stand-in. Nothing is
 * sent anywhere: the page only reads its own files.
 *
 * Cost: O(cells) at start-up.
 */
import { callFunction } from "../functions/functions";
import { el, replaceChildren } from "../taskpane/dom";
import { createHost } from "../taskpane/host";
import { mountPane } from "../taskpane/pane";
import { applyTheme, type Theme } from "../taskpane/theme";
import { DEMO_DIAGNOSTICS, fakeRun } from "./fakeExcel";
import { mountGrid } from "./grid";
import { demoWorkbook } from "./demoWorkbook";
import { DEMO_SHEET, extraPanel } from "./inventedData";
import { addHostErrors, installStandIn, loadScript, shapesFrom, withShapes } from "./standIn";
import { Workbook } from "./workbook";

/** The workbook behind the page; exposed for the browser tests to inspect, never written by them. */
declare global {
  interface Window {
    evensplitDemo?: { workbook: Workbook };
  }
}

function nextEmptyRow(workbook: Workbook): number {
  const used = workbook.usedRect(DEMO_SHEET);
  let row = 1;
  while (row <= (used?.bottom ?? 0) && [0, 1, 2].some((c) => workbook.value(DEMO_SHEET, row, c) !== null)) row++;
  return row;
}

async function start(): Promise<void> {
  const sheetHost = document.getElementById("sheet");
  const paneHost = document.getElementById("pane");
  const problem = document.getElementById("problem");
  if (!sheetHost || !paneHost || !problem) return;
  const prefersDark = window.matchMedia("(prefers-color-scheme: dark)").matches;
  let theme: Theme = prefersDark ? "dark" : "light";
  applyTheme(document.documentElement, theme);

  const registered = installStandIn(window);
  let metadata: unknown;
  try {
    await loadScript("functions.js");
    addHostErrors(window);
    const response = await fetch("functions.json");
    if (!response.ok) throw new Error("functions.json could not be read; run npm run build first.");
    metadata = await response.json();
  } catch (thrown) {
    problem.textContent = thrown instanceof Error ? thrown.message : "The cell functions could not be loaded.";
    return;
  }

  const workbook = demoWorkbook(withShapes(registered, shapesFrom(metadata)));
  window.evensplitDemo = { workbook };

  mountGrid(sheetHost, workbook);
  mountPane(paneHost, { host: createHost(fakeRun(workbook)), calculate: callFunction, diagnostics: DEMO_DIAGNOSTICS });

  let added = 0;
  const themeButton = el(
    "button",
    { class: "es-button demo-button", attrs: { type: "button", "aria-pressed": String(theme === "dark") } },
    "Dark theme",
  );
  themeButton.addEventListener("click", () => {
    theme = theme === "dark" ? "light" : "dark";
    applyTheme(document.documentElement, theme);
    themeButton.setAttribute("aria-pressed", String(theme === "dark"));
  });
  const addButton = el("button", { class: "es-button demo-button", attrs: { type: "button" } }, "Add a panel row");
  addButton.addEventListener("click", () => {
    const row = nextEmptyRow(workbook);
    workbook.writeEntries(DEMO_SHEET, row, 0, [extraPanel(added)], true);
    added++;
  });
  // Some Excel builds hand custom functions blank cells as 0; this shows what the block then says.
  const zerosButton = el(
    "button",
    {
      class: "es-button demo-button",
      attrs: { type: "button", "aria-pressed": "false", title: "Hand the functions blank cells as 0, as some Excel builds do" },
    },
    "Blank cells as 0",
  );
  zerosButton.addEventListener("click", () => {
    const on = zerosButton.getAttribute("aria-pressed") !== "true";
    zerosButton.setAttribute("aria-pressed", String(on));
    workbook.setBlanksAsZeros(on);
  });
  const tools = document.getElementById("tools");
  if (tools) replaceChildren(tools, themeButton, addButton, zerosButton);
}

void start();
