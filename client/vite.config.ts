import { defineConfig } from "vite";

// The page is built into client/dist, which the server serves at /.
export default defineConfig({
  root: new URL(".", import.meta.url).pathname,
  base: "/",
  build: { outDir: "dist", emptyOutDir: true, target: "es2022", chunkSizeWarningLimit: 1000 },
  server: { proxy: { "/api": "http://127.0.0.1:8470" } },
});
