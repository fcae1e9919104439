/**
 * What Excel accepts for the chart properties the pane sets, so that the
 * demo's stand-in refuses what Excel refuses, and what the demo draws at all.
 *
 * Method: each rule follows a Microsoft page, named beside it: the enum pages
 * of the Excel JavaScript API (Excel.ChartType, Excel.ChartMarkerStyle,
 * Excel.ChartLineStyle, Excel.ChartLegendPosition) for the words a property
 * takes; "Excel.ChartSeries class" (a series name "should not be greater than
 * 255 characters"); "Series.MarkerSize property (Excel)" (2 through 72
 * points); "Excel.ChartAxis class" (minimum and maximum take "a numeric value
 * or an empty string"); "Excel.ChartLineFormat class" (a colour is an "HTML
 * color code"); "Excel specifications and limits" (255 data series in one
 * chart). The demo records scatter charts only (the chart the pane makes);
 * any other chart type, valid in Excel, is refused as beyond the demo.
 * Excel reports such refusals as InvalidArgument (Microsoft, "Error handling
 * with the application-specific JavaScript APIs").
 *
 * Cost: O(1) per property set.
 */

/** Microsoft, "Excel.ChartType enum": the scatter family, the only types the demo draws. */
export const SCATTER_TYPES = [
  "XYScatter",
  "XYScatterLines",
  "XYScatterLinesNoMarkers",
  "XYScatterSmooth",
  "XYScatterSmoothNoMarkers",
] as const;

/** Microsoft, "Excel.ChartMarkerStyle enum" (Invalid is what Excel reads back, never a value to set). */
export const MARKER_STYLES = [
  "Automatic",
  "None",
  "Square",
  "Diamond",
  "Triangle",
  "X",
  "Star",
  "Dot",
  "Dash",
  "Circle",
  "Plus",
  "Picture",
] as const;

/** Microsoft, "Excel.ChartLineStyle enum". */
export const LINE_STYLES = [
  "None",
  "Continuous",
  "Dash",
  "DashDot",
  "DashDotDot",
  "Dot",
  "Grey25",
  "Grey50",
  "Grey75",
  "Automatic",
  "RoundDot",
] as const;

/** Microsoft, "Excel.ChartLegendPosition enum" (Invalid excepted, as above). */
export const LEGEND_POSITIONS = ["Top", "Bottom", "Left", "Right", "Corner", "Custom"] as const;

/** Microsoft, "Excel specifications and limits": data series in one chart. */
export const MAX_SERIES = 255;
/** Microsoft, "Excel.ChartSeries class", name. */
export const MAX_SERIES_NAME = 255;

function oneOf(value: unknown, allowed: readonly string[], what: string): string | null {
  return typeof value === "string" && allowed.includes(value)
    ? null
    : `${String(value)} is not ${what}; Excel takes ${allowed.join(", ")}.`;
}

/**
 * Why Excel (or the demo, for a type it does not draw) would refuse this chart type, or null.
 *
 * @example
 * chartTypeRefusal("XYScatter");       // null
 * chartTypeRefusal("ColumnClustered"); // "The demo sheet draws scatter charts only ..."
 */
export function chartTypeRefusal(type: unknown): string | null {
  if (typeof type === "string" && (SCATTER_TYPES as readonly string[]).includes(type)) return null;
  return `The demo sheet draws scatter charts only (${SCATTER_TYPES.join(", ")}); it does not record a ${String(type)} chart.`;
}

/**
 * Why Excel would refuse this marker style, or null.
 *
 * @example
 * markerStyleRefusal("Circle"); // null
 * markerStyleRefusal("Ring");   // "Ring is not a marker style; ..."
 */
export function markerStyleRefusal(style: unknown): string | null {
  return oneOf(style, MARKER_STYLES, "a marker style");
}

/**
 * Why Excel would refuse this line style, or null.
 *
 * @example
 * lineStyleRefusal("Dash"); // null
 */
export function lineStyleRefusal(style: unknown): string | null {
  return oneOf(style, LINE_STYLES, "a line style");
}

/**
 * Why Excel would refuse this legend position, or null.
 *
 * @example
 * legendPositionRefusal("Bottom"); // null
 */
export function legendPositionRefusal(position: unknown): string | null {
  return oneOf(position, LEGEND_POSITIONS, "a legend position");
}

/**
 * Why Excel would refuse this marker size, or null: a whole number of points from 2 through 72.
 *
 * @example
 * markerSizeRefusal(5);  // null
 * markerSizeRefusal(80); // "A marker is 2 to 72 points; 80 is outside."
 */
export function markerSizeRefusal(size: unknown): string | null {
  return typeof size === "number" && Number.isInteger(size) && size >= 2 && size <= 72
    ? null
    : `A marker is 2 to 72 points; ${String(size)} is outside.`;
}

/**
 * Why Excel would refuse this series name, or null: text of at most 255 characters.
 *
 * @example
 * seriesNameRefusal("Thickness"); // null
 */
export function seriesNameRefusal(name: unknown): string | null {
  if (typeof name !== "string") return "A series name is text.";
  return name.length > MAX_SERIES_NAME ? `A series name holds at most 255 characters; this one has ${name.length}.` : null;
}

/**
 * Why Excel would refuse this colour, or null: an HTML colour code (#RRGGBB) or an HTML colour name.
 *
 * @example
 * colourRefusal("#3D5A80"); // null
 * colourRefusal("3D5A80");  // "3D5A80 is not an HTML colour ..."
 */
export function colourRefusal(colour: unknown): string | null {
  return typeof colour === "string" && (/^#[0-9A-Fa-f]{6}$/.test(colour) || /^[A-Za-z]+$/.test(colour))
    ? null
    : `${String(colour)} is not an HTML colour such as #3D5A80 or a colour name.`;
}

/**
 * Why Excel would refuse this axis end, or null: a number, or "" for Excel's own choice.
 *
 * @example
 * axisEndRefusal(46); // null
 * axisEndRefusal(""); // null
 * axisEndRefusal("low"); // "An axis end is a number, or "" for automatic; not low."
 */
export function axisEndRefusal(value: unknown): string | null {
  return value === "" || (typeof value === "number" && Number.isFinite(value))
    ? null
    : `An axis end is a number, or "" for automatic; not ${String(value)}.`;
}

/**
 * Why Excel would refuse this line weight, or null: a number of points (Microsoft, "Excel.ChartLineFormat class", weight).
 *
 * @example
 * lineWeightRefusal(1.5); // null
 */
export function lineWeightRefusal(weight: unknown): string | null {
  return typeof weight === "number" && Number.isFinite(weight) ? null : `A line weight is a number of points; not ${String(weight)}.`;
}
