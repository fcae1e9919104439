/**
 * Entry of taskpane.html inside Excel: waits for Office.js, follows the
 * Office theme, and mounts the pane with the real Excel.run as its host.
 * Opened outside Office, the page says so and points to the demo page.
 *
 * Cost: O(1) at start-up.
 */
import { callFunction } from "../functions/functions";
import { el, replaceChildren } from "./dom";
import { createHost } from "./host";
import { mountPane } from "./pane";
import { applyTheme, themeFor } from "./theme";

function systemTheme(): "light" | "dark" {
  return window.matchMedia("(prefers-color-scheme: dark)").matches ? "dark" : "light";
}

/** What the page shows when it is not inside Excel. */
function showOutsideExcel(app: HTMLElement): void {
  applyTheme(document.documentElement, systemTheme());
  replaceChildren(
    app,
    el(
      "div",
      { class: "es-pane" },
      el("h1", undefined, "Evensplit"),
      el(
        "p",
        undefined,
        "This page is the side pane of the Evensplit add-in and runs inside Excel. To try it without Excel, open demo.html from the same server.",
      ),
    ),
  );
}

/**
 * Whether legacy-check.js found this webview too old and said so in the pane: a webview that can still run
 * this bundle (one lacking only ES2020's built-ins) must not replace that message.
 */
function tooOld(app: HTMLElement): boolean {
  return app.getAttribute("data-unsupported-webview") === "true";
}

/**
 * Office.js loads Excel's host script (and with it the `Excel` namespace)
 * asynchronously, so `Excel` is only known to be there once `Office.onReady`
 * has said the host is Excel; outside Office, onReady answers at once with no
 * host (seen with the real office.js of @microsoft/office-js).
 */
function start(): void {
  const app = document.getElementById("app");
  if (!app || tooOld(app)) return;
  if (typeof Office === "undefined") {
    showOutsideExcel(app);
    return;
  }
  void Office.onReady((info) => {
    // legacy-check.js may have put up its message since (it waits for the document): leave it.
    if (tooOld(app)) return;
    if (info.host !== Office.HostType.Excel || typeof Excel === "undefined") {
      showOutsideExcel(app);
      return;
    }
    applyTheme(document.documentElement, themeFor(Office.context.officeTheme) ?? systemTheme());
    mountPane(app, {
      host: createHost((batch) => Excel.run((context) => batch(context))),
      calculate: callFunction,
      diagnostics: Office.context.diagnostics,
    });
  });
}

start();
