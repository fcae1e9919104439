/**
 * The pane's state as one plain object, and the updates that belong to no
 * single step: moving between steps, the busy flag, the message at the
 * bottom. Each step's own updates live in dataState.ts, questionState.ts,
 * settingsState.ts and resultState.ts; the page (pane.ts and the *View.ts
 * modules) only renders a state and turns events into these updates.
 *
 * Method: every update is a pure function from a state to a new state, so
 * the pane's logic runs and is tested in Node without a page.
 *
 * Cost: O(1) per update.
 */
import type { AnalyzedRange, Consent, ReferenceChoice } from "./workflow";
import type { QuestionForm, SettingsForm } from "./request";

/** One range of the Data step: as typed, as read, and whether its first row is a name. */
export interface RangeSlot {
  readonly text: string;
  readonly range: AnalyzedRange | null;
  readonly useHeader: boolean;
  readonly problem: string | null;
}

/** The listing of filled cells the person is asked about, for the place it was made for. */
export interface Confirmation {
  readonly place: string;
  readonly consent: Consent;
}

export interface PaneState {
  /** 0 Data, 1 Question, 2 Settings, 3 Result. */
  readonly step: number;
  /** Two ranges of pairs: a first and a second value of each item. */
  readonly paired: boolean;
  /**
   * Independent groups: "two" takes a first and a second group from two ranges; "several" takes values
   * and a group column beside them. "none" for one set of values or pairs.
   */
  readonly groups: GroupsKind;
  /**
   * Two groups only: true when they are named in a group column beside one column of values (the second
   * range is then that group column), false when each group is its own range.
   */
  readonly groupColumn: boolean;
  /** Two groups from a group column: true when the label seen second is the first group. */
  readonly swapGroups: boolean;
  /**
   * Data in a database: what the person named for the query, and which pasted row the block reads; null when
   * the data are in the sheet. The cells holding the query's answer are the first range (`slots[0]`).
   */
  readonly database: DatabaseForm | null;
  readonly slots: readonly [RangeSlot, RangeSlot];
  readonly reference: ReferenceChoice;
  /** True once the person picked the reference form; until then it follows the default (a table where one can be made). */
  readonly referenceChosen: boolean;
  readonly question: QuestionForm;
  readonly settings: SettingsForm;
  /** The Settings step's answer: the result will be looked at again as rows arrive (asked only when the block follows new rows). */
  readonly watching: boolean;
  /** The block's top-left cell as typed or suggested. */
  readonly target: string;
  /** True once the person typed or picked the place: the pane then stops suggesting one. */
  readonly targetEdited: boolean;
  readonly chart: boolean;
  readonly showNull: boolean;
  readonly confirm: Confirmation | null;
  readonly busy: boolean;
}

/** The Data step's fields for data in a database, as typed. */
export interface DatabaseForm {
  readonly table: string;
  readonly column: string;
  /** Optional: a column whose values label groups. */
  readonly group: string;
  /** With groups: the pasted row (from 0, header left out) that the block reads. */
  readonly row: number;
  /**
   * The second query as it stood when an answer holding bounds was first read from the cells: the query that
   * answer came from. Null until then.
   */
  readonly answeredBy: string | null;
}

/** Independent groups in the data: none, two from two ranges, or several named by a group column. */
export type GroupsKind = "none" | "two" | "several";

export const STEPS = ["Data", "Question", "Settings", "Result"] as const;

/**
 * A slot with nothing chosen.
 *
 * @example
 * emptySlot(); // { text: "", range: null, useHeader: true, problem: null }
 */
export function emptySlot(): RangeSlot {
  return { text: "", range: null, useHeader: true, problem: null };
}

/**
 * The state of a freshly opened pane.
 *
 * @example
 * initialState().step; // 0
 */
export function initialState(): PaneState {
  return {
    step: 0,
    paired: false,
    groups: "none",
    groupColumn: false,
    swapGroups: false,
    database: null,
    slots: [emptySlot(), emptySlot()],
    reference: "exact",
    referenceChosen: false,
    question: { test: "sign", alternative: "two-sided", center: "", quantile: "0.9" },
    settings: {
      alpha: "0.05",
      confidence: "0.95",
      ties: "drop",
      signMethod: "exact",
      rankMethod: "auto",
      zeros: "drop",
      twoGroupMethod: "rank-sum",
      manyGroupMethod: "median",
      adjust: "holm",
    },
    watching: false,
    target: "",
    targetEdited: false,
    chart: false,
    showNull: false,
    confirm: null,
    busy: false,
  };
}

/**
 * The state shown at another step.
 *
 * @example
 * atStep(initialState(), 2).step; // 2
 */
export function atStep(state: PaneState, step: number): PaneState {
  return { ...state, step };
}

/**
 * The state while a write is under way, or after it.
 *
 * @example
 * withBusy(state, true).busy; // true
 */
export function withBusy(state: PaneState, busy: boolean): PaneState {
  return { ...state, busy };
}
