// Shared set-up of the browser tests: the page built by vite into a temporary folder, the
// server on a real database file with the demo data, and Debian's chromium driven by
// playwright-core (never a downloaded browser).
import { existsSync, mkdirSync, mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import type { Server } from "node:http";
import { chromium, type Browser, type Page } from "playwright-core";
import { build } from "vite";
import { loadDemo } from "../../server/demo-data.js";
import { createRuntime, type Runtime } from "../../server/runtime.js";

export const CHROMIUM = process.env.YIELDLOOP_CHROMIUM ?? "/usr/bin/chromium";
export const HAVE_CHROMIUM = existsSync(CHROMIUM);
export const ARTIFACTS = fileURLToPath(new URL("../../test-artifacts/e2e/", import.meta.url));

export interface Session {
  readonly url: string;
  readonly browser: Browser;
  readonly rt: Runtime;
  readonly server: Server;
  close(): Promise<void>;
}

export async function startSession(): Promise<Session> {
  mkdirSync(ARTIFACTS, { recursive: true });
  const dir = mkdtempSync(join(tmpdir(), "yieldloop-e2e-"));
  const outDir = join(dir, "page");
  await build({
    configFile: fileURLToPath(new URL("../../client/vite.config.ts", import.meta.url)),
    build: { outDir, emptyOutDir: true },
    logLevel: "warn",
  });
  const rt = createRuntime({ database: join(dir, "e2e.db"), workers: 2, staticDir: outDir });
  loadDemo(rt.repo);
  const server = rt.app.listen(0, "127.0.0.1");
  await new Promise((r) => server.once("listening", r));
  const port = (server.address() as { port: number }).port;
  // The flags the machine notes give for headless chromium as root on a closed network.
  const browser = await chromium.launch({
    executablePath: CHROMIUM,
    args: [
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
    ],
  });
  return {
    url: `http://127.0.0.1:${port}/`,
    browser,
    rt,
    server,
    async close() {
      await browser.close();
      server.closeAllConnections();
      server.close();
      await rt.close();
    },
  };
}

/** A page that records console errors (a CSP violation shows up there) and failed requests. */
export async function newPage(
  s: Session,
  width = 1280,
  height = 800,
): Promise<{ page: Page; errors: string[] }> {
  const context = await s.browser.newContext({ viewport: { width, height }, acceptDownloads: true });
  const page = await context.newPage();
  const errors: string[] = [];
  page.on("console", (m) => m.type() === "error" && errors.push(m.text()));
  page.on("pageerror", (e) => errors.push(e.message));
  await page.goto(s.url);
  return { page, errors };
}

export const shot = (page: Page, name: string, fullPage = true) =>
  page.screenshot({ path: join(ARTIFACTS, `${name}.png`), fullPage });
