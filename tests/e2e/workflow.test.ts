import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { catalogue } from "../../src/catalogue.js";
import { HAVE_CHROMIUM, newPage, shot, startSession, type Session } from "./browser.js";

// The whole workflow in a real browser on both invented demo scenarios, asserting on what the
// page shows. Expected values come from the demo generator's own documentation
// (data-demo/*/README.md: years and generating values) and from the API's own answers, read
// back through the same page; no external source is needed for the page itself.
const DEMOS = [
  { name: "Tarn Vell perch", slug: "perch", years: 32, families: null, candidates: 3 },
  {
    name: "Skerra island deer",
    slug: "deer",
    years: 28,
    families: ["beverton-holt", "ricker"],
    candidates: 3,
  },
] as const;

const points = async (page: Page, chart: string) =>
  Number(await page.getAttribute(`canvas[data-chart="${chart}"]`, "data-points"));

if (!HAVE_CHROMIUM && process.env.CI === "true") {
  describe("browser tests", () => {
    it("need Debian's chromium under CI", () => {
      throw new Error(
        "CI=true but chromium was not found at /usr/bin/chromium (or YIELDLOOP_CHROMIUM): install it with apt-get install -y chromium",
      );
    });
  });
}

describe.skipIf(!HAVE_CHROMIUM)("the web page, end to end in chromium", { timeout: 240_000 }, () => {
  let s: Session;
  beforeAll(async () => {
    s = await startSession();
  }, 120_000);
  afterAll(async () => {
    await s?.close();
  });

  it("builds its family list, rule forms and labels from the catalogue, in the catalogue's order", async () => {
    const { page, errors } = await newPage(s);
    const cat = catalogue();
    await page.click("#tab-fit");
    const boxes = await page
      .locator('input[id^="fam-"]')
      .evaluateAll((els) =>
        els.map((e) => [(e as HTMLInputElement).value, e.parentElement?.textContent?.trim()]),
      );
    expect(boxes).toEqual(cat.families.map((f) => [f.id, f.label]));
    await page.click("#tab-counts");
    await page.click(`button[data-demo="${DEMOS[0]!.name}"]`);
    await page.waitForSelector("#series-table tbody tr");
    await page.click("#tab-stability");
    await page.waitForSelector("#rule-kind");
    const kinds = await page
      .locator("#rule-kind option")
      .evaluateAll((els) => els.map((e) => [(e as HTMLOptionElement).value, e.textContent]));
    expect(kinds).toEqual(cat.rules.map((r) => [r.kind, r.label]));
    // Each rule kind's form has one slider per catalogue setting, labelled and ranged from it.
    for (const r of cat.rules) {
      await page.selectOption("#rule-kind", r.kind);
      for (const setting of [...r.settings, ...cat.ruleCommon]) {
        const input = page.locator(`#rule-${setting.name}`);
        expect(await input.getAttribute("type")).toBe("range");
        const label = await page.locator(`label[for="rule-${setting.name}"]`).textContent();
        expect(label).toContain(setting.label);
        expect(Number(await input.getAttribute("min"))).toBeGreaterThanOrEqual(setting.min);
        if (
          setting.defaultTimesK === undefined &&
          setting.name !== "stocking" &&
          setting.name !== "surveyLag"
        )
          expect(Number(await input.getAttribute("value"))).toBe(setting.default);
      }
    }
    expect(errors).toEqual([]);
    await page.close();
  });

  for (const demo of DEMOS) {
    it(`goes from the ${demo.name} counts to a report`, async () => {
      const { page, errors } = await newPage(s);
      // 1. Counts: the demo's series in a table and a chart.
      await page.click(`button[data-demo="${demo.name}"]`);
      await page.waitForSelector("#series-table tbody tr");
      expect(await page.locator("#series-table tbody tr").count()).toBe(demo.years);
      expect(await points(page, "counts")).toBeGreaterThan(demo.years);
      await shot(page, `${demo.slug}-1-counts`);

      // 2. Fit: the ranking, curves over the data and residuals of the chosen model.
      await page.click("#tab-fit");
      if (demo.families) {
        for (const box of await page.locator('input[id^="fam-"]').all()) {
          const v = await box.getAttribute("value");
          if (!demo.families.includes(v as never)) await box.uncheck();
        }
        await page.uncheck("#fit-delay1");
        await page.selectOption("#fit-likelihood", "poisson");
      }
      await page.click("#fit-run");
      await page.waitForSelector("#fit-table tbody tr", { timeout: 180_000 });
      const fitted = await page.locator("#fit-table tbody tr").count();
      expect(fitted).toBe(demo.families ? 2 : 16);
      const weights = await page.locator("#fit-table tbody tr td:nth-child(5)").allTextContents();
      const total = weights.reduce((a, w) => a + Number(w), 0);
      expect(Math.abs(total - 1)).toBeLessThan(0.02); // Akaike weights sum to one (to the 3 digits shown)
      expect(await points(page, "fit")).toBeGreaterThan(demo.years);
      expect(await points(page, "residuals")).toBeGreaterThan(demo.years / 2);
      await shot(page, `${demo.slug}-2-fit`);

      // 3. Stability: a verdict, eigenvalues against the unit circle, and a redraw on a slider move.
      await page.click("#tab-stability");
      await page.waitForSelector("#equilibria-table tbody tr");
      const before = await page.textContent("#verdict");
      expect(before).toMatch(/stable|unstable|collapses/);
      expect(await points(page, "eigenvalues")).toBeGreaterThan(121); // the circle and at least one root
      const slider = page.locator('#rule-box input[type="range"]').first();
      const t0 = await page.getAttribute("#update-time", "data-ms");
      await slider.focus();
      for (let k = 0; k < 5; k++) await page.keyboard.press("ArrowRight");
      await page.waitForFunction((old) => document.getElementById("update-time")?.dataset.ms !== old, t0);
      const ms = Number(await page.getAttribute("#update-time", "data-ms"));
      console.log(`${demo.name}: one preview update took ${ms} ms in the browser`);
      await page.waitForFunction(() =>
        /is .*\. Raising it/.test(document.getElementById("margin")?.textContent ?? ""),
      );
      // The same rule under every fitted model, weighted by Akaike weight.
      await page.waitForFunction(() =>
        /of the weighted model set/.test(document.getElementById("robust")?.textContent ?? ""),
      );
      await page.fill("#bif-count", "60");
      await page.click("#bif-run");
      await page.waitForSelector('canvas[data-chart="bifurcation"]', { timeout: 120_000 });
      expect(await points(page, "bifurcation")).toBeGreaterThan(60);
      await page.fill("#map-count", "16");
      await page.click("#map-run");
      await page.waitForSelector('canvas[data-chart="regime-map"]', { timeout: 120_000 });
      expect(await points(page, "regime-map")).toBeGreaterThanOrEqual(16 * 16 + 1);
      await page.click("#keep-analysis");
      await shot(page, `${demo.slug}-3-stability`);

      // 4. Projection: fan charts, the risk table, and the rules compared.
      await page.click("#tab-projection");
      await page.fill("#u-replicates", "2000");
      await page.click("#project-run");
      await page.waitForSelector("#risk-table", { timeout: 120_000 });
      const risk = await page.locator("#risk-table tbody tr td:nth-child(2)").allTextContents();
      expect(risk[0]).toMatch(/^\d+(\.\d)?%$/);
      expect(await points(page, "abundance")).toBeGreaterThan(7 * 20);
      await page.click("#compare-run");
      await page.waitForSelector("#comparison-table tbody tr", { timeout: 180_000 });
      expect(await page.locator("#comparison-table tbody tr").count()).toBe(1 + demo.candidates);
      await shot(page, `${demo.slug}-4-projection`);

      // 5. Report: the printable page, a CSV as downloaded, and a chart as PNG.
      await page.click("#tab-report");
      await page.click("#report-build");
      const href = await (await page.waitForSelector("#report-link")).getAttribute("href");
      const download = page.waitForEvent("download");
      await page.click('a:has-text("CSV: the risk table")');
      const csv = readFileSync((await (await download).path())!, "utf8");
      const lines = csv.split("\r\n");
      expect(lines[0]).toBe("metric,value,standard error,unit");
      expect(lines[1]!.startsWith("probability of falling below the limit,")).toBe(true);
      // The downloaded table says what the page's risk table says.
      const p = Number(lines[1]!.split(",")[1]);
      expect(`${(100 * p).toFixed(p < 0.1 ? 1 : 0)}%`).toBe(risk[0]);
      const png = page.waitForEvent("download");
      await page.click('a[data-png="abundance"]');
      expect(await (await png).suggestedFilename()).toBe("abundance.png");
      await shot(page, `${demo.slug}-5-report`);
      const report = await s.browser.newPage();
      await report.goto(new URL(href!, s.url).href);
      const text = await report.textContent("body");
      expect(text).toContain("management authority");
      expect(text).toContain("Candidate rules compared");
      expect(await report.locator("svg.fan").count()).toBe(2);
      await shot(report, `${demo.slug}-6-printable-report`);
      await report.close();
      expect(errors).toEqual([]);
      await page.context().close();
    });
  }

  it("shows a long job's progress and cancels it", async () => {
    const { page, errors } = await newPage(s);
    await page.click('button[data-demo="Skerra island deer"]');
    await page.waitForSelector("#series-table tbody tr");
    await page.click("#tab-projection");
    await page.fill("#u-replicates", "1000000");
    await page.fill("#u-horizon", "200");
    await page.click("#project-run");
    await page.waitForSelector(".job progress");
    await page.waitForFunction(
      () => Number(document.querySelector<HTMLProgressElement>(".job progress")?.value) > 0,
      undefined,
      { timeout: 60_000 },
    );
    await shot(page, "cancel-1-running", false);
    await page.click('.job button:has-text("Cancel")');
    await page.waitForSelector('[role=alert]:has-text("cancelled")', { timeout: 60_000 });
    await shot(page, "cancel-2-cancelled", false);
    expect(errors).toEqual([]);
    await page.context().close();
  });

  it("works from the keyboard and in a narrow window", async () => {
    const { page, errors } = await newPage(s, 760, 900);
    await page.focus("#tab-counts");
    await page.keyboard.press("ArrowDown");
    expect(await page.getAttribute("#tab-fit", "aria-selected")).toBe("true");
    expect(await page.isVisible("#step-fit")).toBe(true);
    await page.keyboard.press("ArrowUp");
    await page.click('button[data-demo="Skerra island deer"]');
    await page.waitForSelector("#series-table tbody tr");
    // Every input and select has a label.
    const unlabelled = await page.evaluate(() =>
      [...document.querySelectorAll("input, select")]
        .filter(
          (e) =>
            !(e as HTMLInputElement).labels?.length &&
            !e.getAttribute("aria-label") &&
            (e as HTMLInputElement).type !== "hidden",
        )
        .map((e) => e.id || e.outerHTML.slice(0, 60)),
    );
    expect(unlabelled).toEqual([]);
    // Nothing wider than the window.
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(760);
    await shot(page, "narrow-counts");
    // A CSV with a bad cell is refused with its row and column named.
    await page.setInputFiles("#series-file", {
      name: "bad.csv",
      mimeType: "text/csv",
      buffer: Buffer.from("year,count\n2000,10\n2001,many\n2002,-4\n"),
    });
    await page.waitForSelector("#problem-list li");
    expect(await page.locator("#problem-list li").allTextContents()).toEqual([
      'row 3, column "count": "many" is not a number',
      'row 4, column "count": "-4" is not a number ≥ 0',
    ]);
    await shot(page, "narrow-bad-csv");
    expect(errors.filter((e) => !/422/.test(e))).toEqual([]);
    await page.context().close();
  });
});
