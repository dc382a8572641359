import { readdirSync } from "node:fs";
import { dirname, relative, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import js from "@eslint/js";
import tseslint from "typescript-eslint";
import { importX } from "eslint-plugin-import-x";
import { createTypeScriptImportResolver } from "eslint-import-resolver-typescript";
import reactHooks from "eslint-plugin-react-hooks";

// One-way imports (DEVELOPERS.md, "Layout"): each zone lists a folder (`target`) and what it may not import
// (`from`). Client features meet only in app/ route modules, so each feature gets a zone of its own.
const features = readdirSync(new globalThis.URL("./client/src/features", import.meta.url), { withFileTypes: true })
  .filter((d) => d.isDirectory())
  .map((d) => d.name);
const zones = [
  { target: "./shared", from: ["./server", "./client", "./scripts", "./tests"], message: "shared/ is pure code used by every side: it imports nothing above it." },
  { target: "./server", from: ["./client", "./scripts", "./tests"], message: "The server does not import the client, scripts or tests." },
  { target: "./client", from: ["./server", "./scripts", "./tests"], message: "The client does not import the server, scripts or tests." },
  { target: "./server/src/lib", from: ["./server/src/api", "./server/src/app.ts", "./server/src/index.ts"], message: "server/src/lib holds pieces the resources use: it does not import a resource (api/) or the app." },
  { target: "./server/src/models", from: ["./server/src/api", "./server/src/pipeline", "./server/src/dois", "./server/src/app.ts"], message: "Models do not import resources, the pipeline, DOI registration or the app." },
  { target: ["./client/src/components", "./client/src/lib", "./client/src/config"], from: ["./client/src/features", "./client/src/app"], message: "Shared client code does not import a feature or the app: move the piece to where both can reach it." },
  ...features.map((f) => ({
    target: `./client/src/features/${f}`,
    from: "./client/src/features",
    except: [`./${f}`],
    message: "Features do not import each other: they meet in client/src/app/ (route modules), or the shared piece moves to components/ or lib/.",
  })),
  { target: "./client/src/features", from: "./client/src/app", message: "Features do not import the app shell." },
];

// shared/ is imported as `@shared/…` (tsconfig.json "paths"; vite, vitest and the server build resolve it too),
// never by climbing out of another folder with `../../…/shared/`. Relative imports inside shared/ stay relative.
const SHARED = fileURLToPath(new globalThis.URL("./shared/", import.meta.url));
const sharedAlias = {
  meta: { type: "problem", messages: { alias: "Import shared/ as `@shared/{{rest}}`, not by a relative path from outside it." } },
  create(context) {
    if (context.filename.startsWith(SHARED)) return {};
    const check = (source) => {
      if (!source || source.type !== "Literal" || typeof source.value !== "string" || !source.value.startsWith(".")) return;
      const target = resolve(dirname(context.filename), source.value);
      if (target.startsWith(SHARED)) context.report({ node: source, messageId: "alias", data: { rest: relative(SHARED, target) } });
    };
    return {
      ImportDeclaration: (n) => check(n.source),
      ExportNamedDeclaration: (n) => check(n.source),
      ExportAllDeclaration: (n) => check(n.source),
      ImportExpression: (n) => check(n.source),
    };
  },
};

export default tseslint.config(
  { ignores: ["node_modules", "client/dist", "dist", "coverage", "test-artifacts", "bench-output", ".pg", ".pg-test", ".pg-devtest", ".data"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_", caughtErrors: "none" }],
      "@typescript-eslint/no-explicit-any": "error",
      "@typescript-eslint/no-namespace": "off",
      "no-constant-condition": ["error", { checkLoops: false }],
    },
  },
  {
    files: ["**/*.{ts,tsx}"],
    plugins: { "import-x": importX, tanglebank: { rules: { "shared-alias": sharedAlias } } },
    settings: {
      ...importX.flatConfigs.typescript.settings,
      "import-x/resolver-next": [createTypeScriptImportResolver({ project: "./tsconfig.json" })],
    },
    rules: {
      "import-x/no-restricted-paths": ["error", { zones }],
      "tanglebank/shared-alias": "error",
      "import-x/no-cycle": ["error", { ignoreExternal: true }],
    },
  },
  {
    // Every setting is read and validated in one place (README lists them all).
    files: ["server/src/**/*.{ts,mjs}", "shared/**/*.ts"],
    ignores: ["server/src/config/env.ts"],
    rules: {
      "no-restricted-properties": ["error", { object: "process", property: "env", message: "Read settings through server/src/config/env.ts (config() or jobSettings()), where they are validated." }],
    },
  },
  {
    files: ["client/**/*.{ts,tsx}"],
    plugins: { "react-hooks": reactHooks },
    rules: {
      "react-hooks/rules-of-hooks": "error",
      "react-hooks/exhaustive-deps": "error",
    },
  },
);
