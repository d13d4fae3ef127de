// The quick-analysis thread (see quick-analyses.ts): loads the TypeScript sources with tsx,
// then answers each batch of tasks it is sent with one message, in the order they came.
import { parentPort } from "node:worker_threads";
import { register } from "tsx/esm/api";

register();
const { runQuickBatch } = await import("./quick-tasks.ts");

parentPort.on("message", (batch) => parentPort.postMessage(runQuickBatch(batch)));
