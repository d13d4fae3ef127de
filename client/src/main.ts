// The page: five steps as tabs (arrow keys move between them), each talking to the API.
import { changed } from "./state.js";
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
for (const [name, build] of steps) build(document.getElementById(`step-${name}`)!);

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
changed();
