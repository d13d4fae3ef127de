// The quick-analysis thread: loads the TypeScript sources with tsx, then answers each batch
// of tasks it is sent with one message (see quick-analyses.ts).
import { parentPort } from "node:worker_threads";
import { register } from "tsx/esm/api";

register();
const { runQuickTask } = await import("./quick-tasks.ts");

parentPort.on("message", (batch) => {
  const answers = [];
  for (const task of batch) {
    try {
      answers.push(runQuickTask(task));
    } catch (e) {
      answers.push({ id: task.id, ok: false, error: String(e?.stack ? e.stack : e) });
    }
  }
  parentPort.postMessage(answers);
});
parentPort.postMessage("ready");
