/*
 * Runs first on taskpane.html, before Office.js and the add-in's own scripts,
 * and is written in ES5 so that every webview Office may use can run it.
 *
 * Some Office versions still show add-ins in Internet Explorer 11 ("Trident")
 * or Microsoft Edge Legacy ("EdgeHTML") webviews; Microsoft recommends at least
 * a graceful failure message there, found from navigator.userAgent (Microsoft,
 * "Support older Microsoft webviews and Office versions", Office Add-ins
 * documentation). The add-in's bundles are ES2020 and cannot even be parsed
 * in those webviews, so without this the pane would stay blank. Any other
 * webview lacking ES2020's built-ins gets the same message.
 *
 * Cost: one look at the user agent and three property checks.
 */
(function () {
  var agent = window.navigator.userAgent;
  var oldMicrosoftWebview = agent.indexOf("Trident/") !== -1 || agent.indexOf("Edge/") !== -1;
  var lacksEs2020 =
    typeof window.Promise !== "function" ||
    typeof window.Promise.allSettled !== "function" ||
    typeof window.BigInt !== "function" ||
    typeof String.prototype.matchAll !== "function";
  if (!oldMicrosoftWebview && !lacksEs2020) return;

  function showMessage() {
    var app = document.getElementById("app");
    if (!app) return;
    while (app.firstChild) app.removeChild(app.firstChild);
    var heading = document.createElement("h1");
    heading.appendChild(document.createTextNode("Evensplit needs a newer Office"));
    var text = document.createElement("p");
    text.appendChild(
      document.createTextNode(
        "This version of Office shows add-ins in an old browser engine that Evensplit cannot run in. " +
          "Evensplit works in Microsoft 365, Office 2021 or later on Windows, Office on the Mac and Excel on the web."
      )
    );
    app.appendChild(heading);
    app.appendChild(text);
    app.setAttribute("data-unsupported-webview", "true");
  }

  if (document.readyState === "loading") document.addEventListener("DOMContentLoaded", showMessage);
  else showMessage();
})();
