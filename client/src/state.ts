// What the steps share: the series, the chosen model and rule, and the results so far.
export interface ModelSpec {
  family: string;
  params: Record<string, number>;
  delay: number;
}

export type RuleSpec = Record<string, unknown> & { kind: string };

export interface SeriesRow {
  year: number;
  count: number | null;
  catch: number;
  stocking: number;
  cv: number | null;
}

/** The projection settings the page keeps and shows (the others take the API's defaults). */
export const UNCERTAINTY_KEYS = [
  "replicates",
  "seed",
  "processSd",
  "processAutocorrelation",
  "observationSd",
  "implementationSd",
] as const;

export interface Uncertainty {
  replicates: number;
  seed: number;
  processSd: number;
  processAutocorrelation: number;
  observationSd: number;
  implementationSd: number;
}

export const state = {
  series: null as { id: string; name: string; rows: SeriesRow[]; warnings: unknown[] } | null,
  fitId: null as string | null,
  model: null as ModelSpec | null,
  /** Set from the catalogue's defaults when the page starts (main.ts). */
  rule: {} as RuleSpec,
  start: [] as number[],
  horizon: 25,
  startYear: 0,
  /** Set from the catalogue's defaults when the page starts (main.ts). */
  uncertainty: {} as Uncertainty,
  /** The demo (or stored) scenario the page started from, and its candidate rules. */
  scenarioName: "my scenario",
  candidates: [] as { id: string; name: string; spec: RuleSpec }[],
  stabilityId: null as string | null,
  projectionId: null as string | null,
  comparisonId: null as string | null,
};

type Listener = () => void;
const listeners = new Set<Listener>();

/** Tells every step that the shared state changed. */
export function changed(): void {
  for (const l of listeners) l();
}

export function onChange(l: Listener): void {
  listeners.add(l);
}

/** The scenario spec of the current choices (what the API's analyses take). */
export function scenarioSpec(): Record<string, unknown> | null {
  if (!state.model) return null;
  return {
    model: state.model,
    rule: state.rule,
    start: state.start.length ? state.start : [state.model.params.K! / 2],
    horizon: state.horizon,
    startYear: state.startYear,
  };
}

/** Fit estimates that are not model parameters (start abundance, survey scale, dispersion). */
export const NUISANCE = new Set(["N0", "q", "k", "sigma"]);
