// Lint rules for the whole project (`npm run lint`, also run by `npm test`). The well-kept rule sets
// do the work: ESLint's recommended rules, typescript-eslint's, the React hooks rules and an
// import-cycle check; Prettier owns the layout, so rules about formatting are switched off.
import js from "@eslint/js";
import prettier from "eslint-config-prettier";
import { createTypeScriptImportResolver } from "eslint-import-resolver-typescript";
import importX from "eslint-plugin-import-x";
import reactHooks from "eslint-plugin-react-hooks";
import globals from "globals";
import tseslint from "typescript-eslint";

export default tseslint.config(
  { ignores: ["build/", ".react-router/", ".data/", "node_modules/", "test-results/", "playwright-report/", "drizzle/meta/", "public/"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ["**/*.{ts,tsx,js,mjs}"],
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    plugins: { "react-hooks": reactHooks, "import-x": importX },
    settings: { ...importX.flatConfigs.typescript.settings, "import-x/resolver-next": [createTypeScriptImportResolver()] },
    rules: {
      ...reactHooks.configs.recommended.rules,
      // A cycle between modules makes load order matter and hides layering mistakes.
      "import-x/no-cycle": ["error", { ignoreExternal: true }],
      // Names that start with an underscore are deliberately unused (a tuple's skipped place, a rest sibling).
      "@typescript-eslint/no-unused-vars": [
        "error",
        { argsIgnorePattern: "^_", varsIgnorePattern: "^_", caughtErrors: "none", ignoreRestSiblings: true },
      ],
    },
  },
  {
    // Tests read JSON answers loosely; every API answer they get is checked against its schema
    // (test/support/answers.ts), so an `any` there hides nothing the contract does not catch.
    files: ["test/**/*.{ts,tsx}"],
    rules: { "@typescript-eslint/no-explicit-any": "off" },
  },
  {
    // Playwright's fixtures receive a function named `use`; it is not React's hook.
    files: ["test/e2e/**/*.ts", "test/support/e2e.ts"],
    rules: { "react-hooks/rules-of-hooks": "off" },
  },
  {
    // Declaration files describe modules; their names are used only as types.
    files: ["**/*.d.ts"],
    rules: { "@typescript-eslint/no-unused-vars": "off" },
  },
  prettier,
);
