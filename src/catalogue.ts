import { FIT_METHOD_LABELS, FIT_METHODS } from "./fit/fit-model.js";
import { LIKELIHOOD_LABELS, LIKELIHOODS } from "./fit/likelihood.js";
import { FAMILY_IDS, families } from "./models/families.js";
import { DELAY } from "./models/model-spec.js";
import { type OrderConstraint, type ParamInfo, UNIT_KINDS } from "./params.js";
import {
  COMMON_RULE_SETTINGS,
  DEFAULT_TIMING,
  QUOTA_CHANGE_SETTINGS,
  RULE_CATALOGUE,
  RULE_KINDS,
  RULE_SETTINGS,
  TIMING_LABELS,
  TIMINGS,
} from "./policy/rule-catalogue.js";
import { UNCERTAINTY_SETTINGS } from "./sim/uncertainty.js";
import { KERNEL_FAMILIES, KERNEL_RULES } from "./sim/wasm/kernel-layout.js";

/** How a family or rule kind is projected: in the WebAssembly kernel, or by the TypeScript loop only. */
export type ProjectionPath = "kernel" | "typescript-loop-only";

export interface CatalogueFamily {
  readonly id: string;
  readonly label: string;
  readonly equation: string;
  readonly source: string;
  readonly params: readonly ParamInfo[];
  readonly constraints: readonly OrderConstraint[];
  readonly projection: ProjectionPath;
}

export interface CatalogueRule {
  readonly kind: string;
  readonly label: string;
  readonly equation: string;
  /** The rule's own settings, in form order. */
  readonly settings: readonly ParamInfo[];
  /** The parameter path a margin or the first slider varies. */
  readonly main: string;
  readonly constraints: readonly OrderConstraint[];
  readonly projection: ProjectionPath;
}

/**
 * Everything a form, a message or a help text needs to know about the models, rules and
 * settings, as plain JSON: the one description in src/ that the API serves at
 * /api/v1/catalogue, the page builds its lists, forms and sliders from, and the command
 * line prints as help.
 */
export interface Catalogue {
  readonly families: readonly CatalogueFamily[];
  /** The delay T every family may have. */
  readonly delay: ParamInfo;
  readonly rules: readonly CatalogueRule[];
  /** Settings every rule has (stocking, survey lag). */
  readonly ruleCommon: readonly ParamInfo[];
  /** The optional caps on the quota's year-to-year change. */
  readonly quotaChange: readonly ParamInfo[];
  readonly timings: readonly { readonly value: string; readonly label: string }[];
  /** The timing a rule has when none is given. */
  readonly defaultTiming: string;
  /** The choices of a fit. */
  readonly fitOptions: {
    readonly likelihoods: readonly { readonly value: string; readonly label: string }[];
    readonly methods: readonly { readonly value: string; readonly label: string }[];
  };
  /** The settings of a stochastic projection. */
  readonly uncertainty: readonly ParamInfo[];
  /** Each unit kind in words. */
  readonly unitKinds: Readonly<Record<string, string>>;
}

let built: Catalogue | undefined;

/** The catalogue, built once from the family, rule and setting descriptions. */
export function catalogue(): Catalogue {
  built ??= {
    families: FAMILY_IDS.map((id) => {
      const f = families[id];
      return {
        id,
        label: f.label,
        equation: f.equation,
        source: f.source,
        params: f.params,
        constraints: f.constraints,
        projection: KERNEL_FAMILIES[id] === "typescript-loop-only" ? "typescript-loop-only" : "kernel",
      };
    }),
    delay: DELAY,
    rules: RULE_KINDS.map((kind) => {
      const r = RULE_CATALOGUE[kind];
      return {
        kind,
        label: r.label,
        equation: r.equation,
        settings: r.settings.map((s) => RULE_SETTINGS[s]),
        main: r.main,
        constraints: r.constraints,
        projection: KERNEL_RULES[kind] === "typescript-loop-only" ? "typescript-loop-only" : "kernel",
      };
    }),
    ruleCommon: COMMON_RULE_SETTINGS.map((s) => RULE_SETTINGS[s]),
    quotaChange: QUOTA_CHANGE_SETTINGS.map((s) => RULE_SETTINGS[s]),
    timings: TIMINGS.map((value) => ({ value, label: TIMING_LABELS[value] })),
    defaultTiming: DEFAULT_TIMING,
    fitOptions: {
      likelihoods: LIKELIHOODS.map((value) => ({ value, label: LIKELIHOOD_LABELS[value] })),
      methods: FIT_METHODS.map((value) => ({ value, label: FIT_METHOD_LABELS[value] })),
    },
    uncertainty: Object.values(UNCERTAINTY_SETTINGS),
    unitKinds: UNIT_KINDS,
  };
  return built;
}
