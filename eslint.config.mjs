// ESLint 9 flat configuration: the JavaScript and typescript-eslint recommended rules, the
// platform's own Office Add-in rules (eslint-plugin-office-addins: load before read, sync after
// load, isNullObject, ...), and eslint-config-prettier so that formatting is Prettier's alone.
import js from "@eslint/js";
import officeAddins from "eslint-plugin-office-addins";
import prettier from "eslint-config-prettier";
import globals from "globals";
import tseslint from "typescript-eslint";

const officeRules = Object.fromEntries(Object.keys(officeAddins.rules).map((name) => [`office-addins/${name}`, "error"]));

export default tseslint.config(
  { ignores: ["dist/", "test-output/", "coverage/", "node_modules/", ".probe/"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ["**/*.{ts,mts,js,mjs,cjs}"],
    languageOptions: { globals: { ...globals.browser, ...globals.node } },
    plugins: { "office-addins": officeAddins },
    rules: {
      ...officeRules,
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_" }],
    },
  },
  {
    // CommonJS configuration files.
    files: ["webpack.config.js"],
    rules: { "@typescript-eslint/no-require-imports": "off" },
  },
  {
    // ES5 on purpose: it must run in webviews that cannot parse anything newer.
    files: ["src/taskpane/legacy-check.js"],
    languageOptions: { ecmaVersion: 5, sourceType: "script" },
  },
  prettier,
);
