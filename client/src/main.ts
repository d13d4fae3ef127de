// The page: five steps as tabs (arrow keys move between them), each talking to the API.
import { catalogue, defaultRule, loadCatalogue } from "./catalogue.js";
import { changed, state, UNCERTAINTY_KEYS, type Uncertainty } from "./state.js";
import { countsStep } from "./steps/counts.js";
import { fitStep } from "./steps/fit.js";
import { projectionStep } from "./steps/projection.js";
import { reportStep } from "./steps/report.js";
import { stabilityStep } from "./steps/stability.js";

const steps: [string, (root: HTMLElement) => void][] = [
  ["counts", countsStep],
  ["fit", fitStep],
  ["stability", stabilityStep],
  ["projection", projectionStep],
  ["report", reportStep],
];

// Every list, form, label and default of the page comes from the catalogue: load it first.
async function start(): Promise<void> {
  await loadCatalogue();
  // A new series starts unharvested (the catalogue's first rule kind) until a rule is chosen.
  state.rule = defaultRule(catalogue().rules[0]!.kind, 1000);
  const defaults = Object.fromEntries(catalogue().uncertainty.map((s) => [s.name, s.default]));
  state.uncertainty = Object.fromEntries(
    UNCERTAINTY_KEYS.map((k) => [k, defaults[k]]),
  ) as unknown as Uncertainty;
  for (const [name, build] of steps) build(document.getElementById(`step-${name}`)!);
  wireTabs();
  changed();
}

function wireTabs(): void {
  const tabs = [...document.querySelectorAll<HTMLButtonElement>('[role="tab"]')];
  function select(tab: HTMLButtonElement): void {
    for (const t of tabs) {
      const on = t === tab;
      t.setAttribute("aria-selected", String(on));
      t.tabIndex = on ? 0 : -1;
      document.getElementById(t.getAttribute("aria-controls")!)!.hidden = !on;
    }
    // Charts drawn while hidden need a resize once visible.
    window.dispatchEvent(new Event("resize"));
    changed();
  }
  tabs.forEach((t, i) => {
    t.addEventListener("click", () => select(t));
    t.addEventListener("keydown", (e) => {
      const d =
        e.key === "ArrowDown" || e.key === "ArrowRight"
          ? 1
          : e.key === "ArrowUp" || e.key === "ArrowLeft"
            ? -1
            : 0;
      if (!d) return;
      e.preventDefault();
      const next = tabs[(i + d + tabs.length) % tabs.length]!;
      next.focus();
      select(next);
    });
  });
}

start().catch((e: unknown) => {
  const main = document.querySelector("main") ?? document.body;
  main.textContent = `The page could not start: ${e instanceof Error ? e.message : String(e)}`;
});
