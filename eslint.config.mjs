// ESLint with Next.js's own configuration (core web vitals and TypeScript rules), run by
// `npm run lint` and `npm test` with no warning allowed.
import { defineConfig, globalIgnores } from "eslint/config";
import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

export default defineConfig([
  ...nextVitals,
  ...nextTs,
  {
    rules: {
      // A leading underscore names what is left out on purpose (a destructured field, a parameter).
      "@typescript-eslint/no-unused-vars": ["warn", { argsIgnorePattern: "^_", varsIgnorePattern: "^_", ignoreRestSiblings: true }],
      // After signing in or out, accepting an invitation or opening a record by QR, a full page
      // load is wanted: the session cookie is new and every server component must read it.
      "@next/next/no-location-assign-relative-destination": "off",
    },
  },
  // @react-pdf's <Image> is a PDF element, not an HTML <img>.
  { files: ["lib/pdf/**"], rules: { "jsx-a11y/alt-text": "off" } },
  // CommonJS on purpose (loaded before any ES module, see the file).
  { files: ["**/*.cjs"], rules: { "@typescript-eslint/no-require-imports": "off" } },
  globalIgnores([".next/**", "node_modules/**", ".data/**", "test-results/**", "coverage/**", "next-env.d.ts", "public/sw.js"]),
]);
