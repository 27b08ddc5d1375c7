// ESLint flat config (`npm run lint` passes it with -c: the top level holds only the files the layout names).
import js from "@eslint/js";
import reactHooks from "eslint-plugin-react-hooks";
import globals from "globals";
import tseslint from "typescript-eslint";

export default tseslint.config(
  { ignores: ["build/", ".react-router/", "node_modules/", "data/", "test-results/", "public/"] },
  js.configs.recommended,
  tseslint.configs.recommended,
  {
    files: ["**/*.{ts,tsx,js,mjs}"],
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
  },
  { files: ["app/**/*.{ts,tsx}"], ...reactHooks.configs.flat.recommended },
  {
    rules: {
      // `_name` marks a parameter or binding kept on purpose (a signature React Router or a callback dictates).
      "@typescript-eslint/no-unused-vars": [
        "error",
        { argsIgnorePattern: "^_", varsIgnorePattern: "^_", caughtErrorsIgnorePattern: "^_" },
      ],
    },
  },
);
