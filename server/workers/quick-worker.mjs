// The quick-analysis thread (a one-thread piscina pool, see quick-analyses.ts): loads the
// TypeScript sources with tsx, then answers each batch of tasks it is given.
import { register } from "tsx/esm/api";

register();
const { runQuickBatch } = await import("./quick-tasks.ts");

export default function (batch) {
  return runQuickBatch(batch);
}
