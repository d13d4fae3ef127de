// Worker-thread entry: lets the thread load the TypeScript sources, then runs tasks.
import { register } from "tsx/esm/api";

register();
const { runTask } = await import("./tasks.ts");

export default function (task) {
  return runTask(task);
}
