/**
 * Builds dist/ (`npm run build`; `npx webpack --mode development` for a readable build):
 *
 * - functions.js   the EVENSPLIT cell functions, loadable on its own: it registers
 *                  every function with CustomFunctions.associate when it runs;
 * - functions.json their metadata, generated from the JSDoc tags of
 *                  src/functions/functions.ts by custom-functions-metadata-plugin;
 * - taskpane.html  the shared-runtime page: Office.js (from its CDN script tag in the
 *                  template), then functions.js, then taskpane.js, which reuses the
 *                  modules functions.js already holds;
 * - demo.html      the in-page demo without Office.js (demo.js);
 * - manifest.xml, assets/ and the pages' style sheets copied as they are;
 * - help/          one help page per function, linked from functions.json's helpUrl
 *                  (scripts/helpPages.ts, from the same JSDoc as the metadata).
 *
 * TypeScript is only transpiled here (ts-loader, transpileOnly); `npm run typecheck`
 * does the type checking once for the whole project. In development ts-loader also emits
 * its own source maps, so the bundle's map leads to the TypeScript lines rather than to the
 * transpiled JavaScript (`npm run coverage:all` maps the browser's coverage through it).
 */
const fs = require("node:fs");
const path = require("node:path");
const webpack = require("webpack");
const HtmlWebpackPlugin = require("html-webpack-plugin");
const CopyWebpackPlugin = require("copy-webpack-plugin");
const CustomFunctionsMetadataPlugin = require("custom-functions-metadata-plugin");

const functionsSource = "./src/functions/functions.ts";

/**
 * Writes the help pages and each function's helpUrl once the metadata plugin has made
 * functions.json. scripts/helpPages.ts is TypeScript: tsx loads it here as the scripts run.
 */
class HelpPagesPlugin {
  apply(compiler) {
    compiler.hooks.thisCompilation.tap("HelpPagesPlugin", (compilation) => {
      const stage = webpack.Compilation.PROCESS_ASSETS_STAGE_ADDITIONAL;
      compilation.hooks.processAssets.tap({ name: "HelpPagesPlugin", stage }, () => {
        const metadata = compilation.getAsset("functions.json");
        if (!metadata) return; // the metadata plugin has reported why
        const paneCss = path.resolve(__dirname, "src/taskpane/taskpane.css");
        compilation.fileDependencies.add(paneCss);
        const { helpFiles } = require("tsx/cjs/api").require("./scripts/helpPages.ts", __filename);
        const source = fs.readFileSync(path.resolve(__dirname, functionsSource), "utf8");
        const help = helpFiles(metadata.source.source().toString(), source, fs.readFileSync(paneCss, "utf8"));
        compilation.updateAsset("functions.json", new webpack.sources.RawSource(help.metadataJson));
        // Marked minimized so webpack's own minimizer passes them by: it decoded &lt;&gt; in a word list to a bare "<>",
        // which is not valid HTML. The pages are small and are served as written.
        for (const [name, text] of help.files) compilation.emitAsset(name, new webpack.sources.RawSource(text), { minimized: true });
      });
    });
  }
}

module.exports = (_env, argv) => {
  const mode = argv.mode ?? "production";
  return {
    mode,
    devtool: mode === "production" ? false : "source-map",
    entry: {
      functions: functionsSource,
      // The pane runs on the same page as the functions and uses their module instances
      // (functions.js holds the webpack runtime), so the functions register once.
      taskpane: { import: "./src/taskpane/index.ts", dependOn: "functions" },
      demo: "./src/demo/index.ts",
    },
    output: {
      // EVENSPLIT_DIST builds elsewhere (a private build beside a running test; the tests read the same variable).
      path: process.env.EVENSPLIT_DIST ? path.resolve(process.env.EVENSPLIT_DIST) : path.resolve(__dirname, "dist"),
      filename: "[name].js",
      // The bundles share state through globalThis, which also exists where functions.js is
      // loaded outside a browser window (the bundle test).
      globalObject: "globalThis",
      clean: true,
    },
    resolve: { extensions: [".ts", ".js"] },
    module: {
      rules: [
        {
          test: /\.ts$/,
          exclude: /node_modules/,
          use: { loader: "ts-loader", options: { transpileOnly: true, compilerOptions: { sourceMap: mode !== "production" } } },
        },
      ],
    },
    performance: { hints: false },
    plugins: [
      new CustomFunctionsMetadataPlugin({ output: "functions.json", input: functionsSource }),
      new HelpPagesPlugin(),
      // The metadata plugin appends `CustomFunctions.associate(id, fn)` to functions.ts; this
      // binds that name to our registrar, which forwards to Excel's runtime when it is there,
      // so the same module also runs on the demo page, which has no Office.js.
      new webpack.ProvidePlugin({ CustomFunctions: [path.resolve(__dirname, "src/functions/runtime.ts"), "registrar"] }),
      new HtmlWebpackPlugin({
        filename: "taskpane.html",
        template: "./src/taskpane/taskpane.html",
        chunks: ["functions", "taskpane"],
        chunksSortMode: "manual",
      }),
      new HtmlWebpackPlugin({ filename: "demo.html", template: "./src/demo/demo.html", chunks: ["demo"] }),
      new CopyWebpackPlugin({
        patterns: [
          { from: "manifest.xml", to: "manifest.xml" },
          { from: "assets/*.png", to: "assets/[name][ext]" },
          // The pages link their style sheets as files (their content security policy allows no inline styles).
          { from: "src/taskpane/*.css", to: "[name][ext]", noErrorOnMissing: true },
          // ES5 on purpose, copied untouched: it must run in webviews that cannot parse the bundles.
          { from: "src/taskpane/legacy-check.js", to: "legacy-check.js" },
          { from: "src/demo/*.css", to: "[name][ext]", noErrorOnMissing: true },
        ],
      }),
    ],
  };
};
