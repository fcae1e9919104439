/**
 * The guided side pane: Data → Question → Settings → Result, ending in a live
 * result block of EVENSPLIT formulas written beside the data.
 *
 * Method: the state is one plain object (paneState.ts) changed only by the
 * pure updates of dataState.ts, questionState.ts, settingsState.ts and
 * resultState.ts; each step's page (dataView.ts, questionView.ts,
 * settingsView.ts, resultView.ts) is built once and renders what those
 * modules derive from the state, so typing never loses focus. This module
 * holds the state, runs the workbook operations (through workflow.ts and the
 * host) and renders after each change. Moving to a step puts the focus on
 * its heading; messages go to a polite live region.
 *
 * Cost: O(cells of the data) per render of the Result step's preview.
 */
import type { CatalogueCall, ManyGroupMethod, TwoGroupMethod } from "../report/resultBlock";
import { formatAddress, parseAddress } from "./a1";
import { button, newId } from "./controls";
import {
  choices,
  dataReady,
  dataStepProblem,
  dataView,
  setDataKind,
  setGroupColumn,
  setSwapGroups,
  setReference,
  setUseHeader,
  slotCleared,
  slotFailed,
  slotRead,
  splitIntoPairs,
  usesTwoRanges,
} from "./dataState";
import { dataPage } from "./dataView";
import { databaseAnswerRead, databaseView, setDatabaseField, setDatabaseRow } from "./databaseState";
import { el, replaceChildren, show } from "./dom";
import type { Host } from "./host";
import { atStep, initialState, STEPS, withBusy, type PaneState } from "./paneState";
import { currentRequest, questionStepProblem, questionView, setAlternative, setCenter, setQuantile, setTest } from "./questionState";
import { questionPage } from "./questionView";
import {
  NO_ADDRESS,
  PAST_EDGE,
  resultView,
  setChart,
  setConfirm,
  setShowNull,
  setTarget,
  settleResult,
  suggestTarget,
  targetFromSelection,
  targetPlace,
  targetSize,
} from "./resultState";
import { resultPage } from "./resultView";
import { setSetting, setWatching, settingsStepProblem, settingsView } from "./settingsState";
import { settingsPage } from "./settingsView";
import { environmentFrom, writeCheckSheet, type DiagnosticsLike } from "./checkSheet";
import { REFERENCE_CASES } from "../report/installationCheck";
import { EVENSPLIT_VERSION } from "../report/version";
import { subsetSumEngine } from "../stats/subsetSumStep";
import { analyzeRange, blockInputs, blockRefs, defaultPlace, writeResult, type WriteOutcome } from "./workflow";
import { blockAt, readBlock, sameBlockFormulas, type BlockReading } from "./blockEdit";
import { blockPreview, blockWrite } from "./preview";
import { structuredReference } from "./references";
import { reportCopy } from "./reportText";
import { onSheet, wordingRequest, type BlockMark } from "./writePlan";

export interface PaneOptions {
  readonly host: Host;
  /** Runs a catalogue function by id: the preview's calculator (functions.ts callFunction). */
  readonly calculate: CatalogueCall;
  /** Office.context.diagnostics (Excel's version and platform) for the installation check; absent where the host reports none. */
  readonly diagnostics?: DiagnosticsLike | null;
}

function errorMessage(thrown: unknown): string {
  return thrown instanceof Error && thrown.message ? thrown.message : "The workbook did not answer.";
}

/**
 * Builds the pane inside `root` and wires it to the workbook.
 *
 * @example
 * mountPane(document.getElementById("app")!, { host: createHost((b) => Excel.run(b)), calculate: callFunction });
 */
export function mountPane(root: HTMLElement, options: PaneOptions): void {
  const { host, calculate } = options;
  let state: PaneState = initialState();

  // Focusable, so that after a write the focus can rest on the confirmation instead of falling to the page.
  const status = el("p", { class: "es-status", attrs: { role: "status", "aria-live": "polite", tabindex: "-1" } });
  const say = (message: string): void => {
    status.textContent = message;
  };
  /**
   * Every change the person makes drops the message at the bottom: it answered
   * an earlier action and may no longer hold. A quiet update (the data read
   * again in the background) keeps it.
   */
  const update = (next: PaneState, options: { showStepProblems?: boolean; quiet?: boolean } = {}): void => {
    state = settleResult(next);
    if (!options.quiet) say("");
    render(options.showStepProblems ?? false);
  };

  const stepButtons = STEPS.map((name, i) =>
    button(`${i + 1}. ${name}`, "quiet", () => {
      void goTo(i);
    }),
  );
  const nav = el(
    "nav",
    { class: "es-steps", attrs: { "aria-label": "Steps" } },
    el("ol", undefined, ...stepButtons.map((b) => el("li", undefined, b))),
  );
  const headings = STEPS.map((name, i) => el("h2", { id: newId("step"), attrs: { tabindex: "-1" } }, `${i + 1}. ${name}`));

  const data = dataPage(headings[0], {
    kind: (kind) => update(setDataKind(state, kind)),
    rangeTyped: (index, text) => void analyzeSlot(index, text),
    useSelection: (index) => void useSelection(index),
    header: (index, useHeader) => update(setUseHeader(state, index, useHeader)),
    reference: (choice) => update(setReference(state, choice)),
    asPairs: () => update(splitIntoPairs(state)),
    groupColumn: (on) => update(setGroupColumn(state, on)),
    swapGroups: (on) => update(setSwapGroups(state, on)),
    editBlock: () => void editSelectedBlock(true),
    next: () => void goTo(1),
    database: {
      name: (field, text) => update(setDatabaseField(state, field, text)),
      center: (text) => update(setCenter(state, text)),
      confidence: (text) => update(setSetting(state, "confidence", text)),
      copy: (which) => {
        const view = databaseView(state);
        const query = which === "first" ? view?.firstQuery : view?.secondQuery;
        if (query) copyText(query, `The ${which} query was copied. Run it in your database tool and paste its answer into the sheet.`);
      },
      answerTyped: (text) => void analyzeSlot(0, text),
      answerFromSelection: () => void useSelection(0),
      row: (index) => update(setDatabaseRow(state, index)),
    },
  });
  const question = questionPage(headings[1], {
    test: (test) => update(setTest(state, test)),
    quantile: (text) => update(setQuantile(state, text)),
    alternative: (alternative) => update(setAlternative(state, alternative)),
    center: (text) => update(setCenter(state, text)),
    back: () => void goTo(0),
    next: () => void goTo(2),
  });
  const settings = settingsPage(headings[2], {
    setting: (key, value) => update(setSetting(state, key, value)),
    watching: (watching) => update(setWatching(state, watching)),
    back: () => void goTo(1),
    next: () => void goTo(3),
  });
  const result = resultPage(headings[3], {
    target: (text) => update(setTarget(state, text)),
    targetFromSelection: () => void useSelectionAsTarget(),
    showNull: (visible) => update(setShowNull(state, visible)),
    chart: (chart) => update(setChart(state, chart)),
    write: (agreed) => void write(agreed),
    keep: () => {
      update(setConfirm(state, null));
      result.targetInput.focus();
      say("Nothing was written. Choose another place for the block.");
    },
    reread: () => void rereadData(),
    back: () => void goTo(2),
    copy: () => copyResult(),
    startOver: () => {
      update(initialState());
      headings[0].focus();
    },
  });

  const steps = [data.element, question.element, settings.element, result.element];
  const checkHeading = el("h2", { id: newId("check") }, "Installation");
  const checkButton = button("Check this installation", "secondary", () => void checkInstallation());
  const installation = el(
    "section",
    { class: "es-installation", attrs: { "aria-labelledby": checkHeading.id } },
    checkHeading,
    el(
      "p",
      undefined,
      "Adds a sheet where the installed functions calculate reference cases with known answers, each beside its expected value and source, to keep with the workbook as a record.",
    ),
    checkButton,
  );
  replaceChildren(
    root,
    el(
      "div",
      { class: "es-pane" },
      el(
        "header",
        { class: "es-header" },
        el("h1", undefined, "Evensplit"),
        el(
          "p",
          undefined,
          "Tests and bounds for a median or a quantile that count and rank the values; the sign test asks the least of the data",
        ),
      ),
      nav,
      el("main", undefined, ...steps),
      status,
      installation,
    ),
  );

  /** Writes the installation check's sheet (checkSheet.ts); the button rests while the workbook works. */
  async function checkInstallation(): Promise<void> {
    checkButton.disabled = true;
    say("Writing the installation check…");
    try {
      const facts = {
        evensplitVersion: EVENSPLIT_VERSION,
        ...environmentFrom(options.diagnostics),
        exactStep: subsetSumEngine().name,
        checkedAt: new Date(),
      };
      say((await writeCheckSheet(host, REFERENCE_CASES, facts)).message);
    } catch (thrown) {
      say(`No check sheet was written: ${errorMessage(thrown)}`);
    } finally {
      checkButton.disabled = false;
    }
  }

  async function analyzeSlot(index: number, text: string, quiet = false): Promise<void> {
    if (text.trim() === "") {
      update(slotCleared(state, index), { quiet });
      return;
    }
    try {
      // Read first: the state may change while the workbook answers.
      const analysis = await analyzeRange(host, text);
      update(databaseAnswerRead(state, slotRead(state, index, text, analysis)), { quiet });
    } catch (thrown) {
      update(slotFailed(state, index, text, errorMessage(thrown)), { quiet });
    }
  }

  /**
   * The data may have changed while the focus was in the sheet: read the
   * ranges again when the focus comes back into the pane, so the preview
   * follows the cells (the worksheet's change events need ExcelApi 1.7 and
   * a handler to remove again; a read on return covers every host).
   */
  let rereading = false;
  async function followData(): Promise<void> {
    if (rereading || state.busy) return;
    rereading = true;
    try {
      const used = usesTwoRanges(state) ? [0, 1] : [0];
      for (const i of used) if (state.slots[i].range) await analyzeSlot(i, state.slots[i].text, true);
    } finally {
      rereading = false;
    }
  }
  root.addEventListener("focusin", (event) => {
    const from = event.relatedTarget;
    if (!(from instanceof Node) || !root.contains(from)) void followData();
  });

  async function useSelection(index: number): Promise<void> {
    try {
      const address = await host.selection();
      await analyzeSlot(index, address);
      say(`Read ${state.slots[index].text}.`);
    } catch (thrown) {
      say(`The selection could not be read: ${errorMessage(thrown)}`);
    }
  }

  async function useSelectionAsTarget(): Promise<void> {
    try {
      const address = await host.selection();
      update(targetFromSelection(state, address));
    } catch (thrown) {
      say(`The selection could not be read: ${errorMessage(thrown)}`);
    }
  }

  async function rereadData(): Promise<void> {
    const used = usesTwoRanges(state) ? [0, 1] : [0];
    for (const i of used) if (state.slots[i].text) await analyzeSlot(i, state.slots[i].text);
    await placeBlock();
    say("The data were read again.");
  }

  function stepProblem(step: number): string | null {
    if (step === 0) return dataStepProblem(state);
    if (step === 1) return questionStepProblem(state);
    if (step === 2) return settingsStepProblem(state);
    return null;
  }

  async function placeBlock(): Promise<void> {
    const built = currentRequest(state);
    if (!built.ok || !dataReady(state) || state.targetEdited) return;
    try {
      const size = targetSize(state, built.request, calculate);
      const place = await defaultPlace(host, choices(state), size.rows, size.columns);
      update(suggestTarget(state, formatAddress({ ...place.rect, bottom: place.rect.top, right: place.rect.left })));
    } catch (thrown) {
      say(`The sheet could not be searched for an empty place: ${errorMessage(thrown)}`);
    }
  }

  async function goTo(step: number): Promise<void> {
    for (let s = 0; s < step; s++) {
      const problem = stepProblem(s);
      if (problem) {
        update(atStep(state, s), { showStepProblems: true });
        say(problem);
        focusFirstProblem(s);
        return;
      }
    }
    state = atStep(state, step);
    if (step === 3) await placeBlock();
    update(state);
    headings[step].focus();
  }

  function focusFirstProblem(step: number): void {
    const invalid = steps[step].querySelector<HTMLElement>("[aria-invalid='true']");
    (invalid ?? headings[step]).focus();
  }

  async function write(agreed: boolean): Promise<void> {
    const built = currentRequest(state);
    if (!built.ok || !dataReady(state) || state.busy) return;
    const target = targetPlace(state, built.request, calculate);
    if (!target || !onSheet(target.rect)) {
      const message = target ? PAST_EDGE : NO_ADDRESS;
      result.targetProblem(message);
      result.targetInput.focus();
      say(message);
      return;
    }
    const place = formatAddress(target.rect, target.sheet);
    // Consent holds only for the place, and the cells, the person was shown.
    const consent = agreed && state.confirm?.place === place ? state.confirm.consent : null;
    update(withBusy(state, true));
    let outcome: WriteOutcome;
    try {
      outcome = await writeResult(host, {
        choices: choices(state),
        reference: state.reference,
        request: built.request,
        target,
        chart: state.chart,
        consent,
        calculate,
      });
    } catch (thrown) {
      // writeResult only throws before the workbook was changed: while reading it or planning.
      update(withBusy(state, false));
      say(`Nothing was written: ${errorMessage(thrown)}`);
      return;
    }
    state = withBusy(state, false);
    if (outcome.kind === "confirm") {
      update(setConfirm(state, { place, consent: outcome.consent }));
      const count = outcome.consent.filled.length;
      say(
        outcome.changed
          ? `The cells changed since they were listed, so nothing was written. Look at the list again: ${count} of them are not empty.`
          : `${count} of the cells at ${formatAddress(target.rect)} are not empty. Nothing was written yet.`,
      );
      result.confirmTitle.focus();
      return;
    }
    state = setConfirm(state, null);
    if (outcome.kind === "refused" || outcome.kind === "undone") {
      update(state);
      if (outcome.kind === "refused") result.targetProblem(outcome.message);
      result.targetInput.focus();
      say(outcome.message);
      return;
    }
    const chart = outcome.chartAt
      ? ` A chart was added at ${outcome.chartAt}; the cells its lines read are ${outcome.helperCells ?? ""}, beside the block.`
      : "";
    const made = outcome.created.length > 0 ? ` The data became table ${outcome.created.map((t) => t.name).join(" and ")}.` : "";
    const cleared =
      outcome.replaced.length > 0
        ? ` The earlier block at ${outcome.replaced.map((b) => formatAddress(b.rect)).join(" and ")} was cleared first.`
        : "";
    const written = `The block was written to ${outcome.address} as formulas; it recalculates when the data change.${cleared}${made}${chart}`;
    // The place stays the block's own: writing again replaces it there rather than adding another block.
    state = setTarget(state, formatAddress({ ...target.rect, bottom: target.rect.top, right: target.rect.left }, target.sheet));
    if (outcome.created.length > 0) {
      state = setReference(state, "exact");
      await rereadData();
    }
    update(state);
    say(written);
    // The Write button was disabled while writing, which drops the focus: it goes to the confirmation, scrolled into view.
    status.focus();
  }

  /**
   * Copies the result as text and HTML through the page's copy event, which
   * works inside a click without asking for the clipboard permission (the
   * asynchronous Clipboard API needs it, and Office's webviews may not grant it).
   */
  function copyResult(): void {
    const built = currentRequest(state);
    const rows = resultView(state, calculate).rows;
    if (!built.ok || rows.length === 0) return;
    const copy = reportCopy(wordingRequest(built.request), rows);
    const copied = copyThroughEvent({ "text/plain": copy.text, "text/html": copy.html });
    say(
      copied
        ? "The result was copied: one sentence for a report, then the block’s rows (as text and as a table)."
        : "This browser did not allow copying; select the preview table and copy it instead.",
    );
  }

  /** Copies a plain text (a query) through the copy event, as copyResult does. */
  function copyText(text: string, done: string): void {
    say(
      copyThroughEvent({ "text/plain": text }) ? done : "This browser did not allow copying; select the query's text and copy it instead.",
    );
  }

  /** Puts each format's data on the clipboard inside the page's copy event; true when the browser copied. */
  function copyThroughEvent(data: Readonly<Record<string, string>>): boolean {
    const fill = (event: ClipboardEvent): void => {
      for (const [format, text] of Object.entries(data)) event.clipboardData?.setData(format, text);
      event.preventDefault();
    };
    document.addEventListener("copy", fill);
    try {
      return document.execCommand("copy");
    } finally {
      document.removeEventListener("copy", fill);
    }
  }

  /** The text to read for a reference of a block's formula: a table column with its header, or the cells with the name row above them when there is one. */
  async function referenceAddress(reference: string, sheet: string): Promise<string | null> {
    if (reference.includes("[")) {
      for (const table of await host.tables(sheet)) {
        const index = table.columns.findIndex(
          (column) => structuredReference(table.name, column).toLowerCase() === reference.toLowerCase(),
        );
        if (index >= 0) return formatAddress({ ...table.rect, left: table.rect.left + index, right: table.rect.left + index }, table.sheet);
      }
      return null;
    }
    const parsed = parseAddress(reference.replace(/\$/g, ""));
    if (!parsed) return null;
    const where = parsed.sheet ?? sheet;
    let top = parsed.top;
    if (top > 0) {
      const above = await host.read(formatAddress({ ...parsed, top: top - 1, bottom: top - 1 }, where));
      if (above && above.values[0].some((v) => typeof v === "string" && v.trim() !== "")) top -= 1;
    }
    return formatAddress({ ...parsed, top }, where);
  }

  /**
   * Loads the block that holds the selected cell: its data, question and
   * settings as its formulas give them (blockEdit.ts), accepted only when
   * writing them again would give exactly those formulas; the place stays the
   * block's own, so writing replaces it there.
   */
  async function editSelectedBlock(announce: boolean): Promise<void> {
    try {
      const selected = parseAddress(await host.selection());
      const blocks = await host.blocks();
      const sheet = selected?.sheet ?? blocks[0]?.sheet ?? "";
      const block = selected ? blockAt(blocks, sheet, selected) : null;
      if (!block) {
        if (announce)
          say("The selected cell is not part of a block Evensplit wrote. Select a cell of the block, then press the button again.");
        return;
      }
      const cells = await host.read(formatAddress(block.rect, block.sheet));
      const reading = cells ? readBlock(cells.formulas) : null;
      const loaded = reading && cells ? await stateFromBlock(reading, block, cells.formulas) : null;
      if (!loaded) {
        say(
          `The block at ${formatAddress(block.rect, block.sheet)} does not read back as this version of the pane writes it (it may come from another version, or have been edited by hand). Choose its data again to write a new one.`,
        );
        return;
      }
      update(loaded);
      headings[3].focus();
      say(
        `The block at ${formatAddress(block.rect, block.sheet)} is loaded: change what you need, then write it; it is replaced where it is.`,
      );
    } catch (thrown) {
      if (announce) say(`The block could not be read: ${errorMessage(thrown)}`);
    }
  }

  async function stateFromBlock(
    reading: BlockReading,
    block: BlockMark,
    formulas: readonly (readonly unknown[])[],
  ): Promise<PaneState | null> {
    const kind = reading.groups === "two" ? "two-groups" : reading.groups === "several" ? "groups" : reading.paired ? "pairs" : "one";
    let base = setGroupColumn(setDataKind(initialState(), kind), reading.groupColumn);
    for (let i = 0; i < reading.references.length; i++) {
      const address = await referenceAddress(reading.references[i], block.sheet);
      if (!address) return null;
      base = slotRead(base, i, address, await analyzeRange(host, address));
    }
    const open = reading.references.some((r) => /\$?1048576$/.test(r));
    base = setReference(base, open ? "open" : "exact");
    // Groups take their test from the kind; the one-sample choice of test is left as it was.
    if (reading.groups === "none") base = setTest(base, reading.test);
    const center = reading.groups === "several" && !reading.withTarget ? "" : String(reading.center);
    base = setAlternative(setCenter(base, center), reading.alternative);
    if (reading.groups === "two" && reading.groupMethod) base = setSetting(base, "twoGroupMethod", reading.groupMethod as TwoGroupMethod);
    if (reading.groups === "several" && reading.groupMethod)
      base = setSetting(base, "manyGroupMethod", reading.groupMethod as ManyGroupMethod);
    if (reading.adjust) base = setSetting(base, "adjust", reading.adjust);
    if (reading.quantile !== null) base = setQuantile(base, String(reading.quantile));
    base = setSetting(base, "alpha", String(reading.alpha));
    if (reading.ties) base = setSetting(base, "ties", reading.ties);
    if (reading.signMethod) base = setSetting(base, "signMethod", reading.signMethod);
    if (reading.rankMethod) base = setSetting(base, "rankMethod", reading.rankMethod);
    if (reading.zeros) base = setSetting(base, "zeros", reading.zeros);
    base = setTarget(atStep(base, 3), formatAddress({ ...block.rect, bottom: block.rect.top, right: block.rect.left }, block.sheet));
    // The formulas do not name the confidence or the answer about looking again: each is tried against the whole block.
    // Nor which of two labels is the first group: both orders are tried.
    const orders = reading.groupColumn ? [false, true] : [false];
    const candidates = reading.confidences.flatMap((confidence) =>
      orders.flatMap((swapped) =>
        [false, true].map((watching) => setWatching(setSetting(setSwapGroups(base, swapped), "confidence", String(confidence)), watching)),
      ),
    );
    for (const candidate of candidates) {
      const built = currentRequest(candidate);
      if (!built.ok || !dataReady(candidate)) continue;
      const c = choices(candidate);
      const rows = blockPreview(
        wordingRequest(built.request),
        blockInputs(c),
        blockRefs(c, candidate.reference, [], block.sheet),
        calculate,
      );
      const again = blockWrite(rows, block.sheet, block.rect).formulas;
      // A block written with its chart loads with the chart asked for, so writing it again keeps the chart.
      if (sameBlockFormulas(again, formulas, rows)) return setChart(candidate, block.chart !== undefined);
    }
    return null;
  }

  function render(showStepProblems: boolean): void {
    steps.forEach((s, i) => show(s, i === state.step));
    stepButtons.forEach((b, i) => {
      if (i === state.step) b.setAttribute("aria-current", "step");
      else b.removeAttribute("aria-current");
    });
    data.render(
      dataView(state),
      state.slots.map((s) => s.text),
    );
    question.render(questionView(state, showStepProblems && state.step === 1));
    settings.render(settingsView(state));
    result.render(resultView(state, calculate));
  }

  render(false);
  // Opened with a cell of a block selected: that block is loaded to be changed.
  void editSelectedBlock(false);
}
