import { fileURLToPath } from "node:url";
import { defineConfig } from "vite";
import react from "@vitejs/plugin-react";
import tailwindcss from "@tailwindcss/vite";

export default defineConfig({
  root: "client",
  plugins: [react(), tailwindcss()],
  // `@shared/…` is shared/ (tsconfig.json "paths"; vitest.config.ts and the server build use the same alias).
  resolve: { alias: [{ find: /^@shared\//, replacement: fileURLToPath(new URL("./shared/", import.meta.url)) }] },
  build: { outDir: "dist", emptyOutDir: true, chunkSizeWarningLimit: 1200 },
  server: { proxy: { "/api": "http://127.0.0.1:3000", "/schemas": "http://127.0.0.1:3000" } },
});
