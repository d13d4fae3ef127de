// Worker-thread entry: lets the thread load the TypeScript sources, then runs tasks.
// Typed arrays in a result are transferred to the main thread, not copied.
import { move, transferableSymbol, valueSymbol } from "piscina";
import { register } from "tsx/esm/api";

register();
const { runTask } = await import("./tasks.ts");

export default function (task) {
  const result = runTask(task);
  const buffers = [];
  const collect = (o) => {
    for (const v of Object.values(o))
      if (ArrayBuffer.isView(v) && !buffers.includes(v.buffer)) buffers.push(v.buffer);
  };
  if (result.ok) {
    collect(result);
    if (result.parts) collect(result.parts);
  }
  if (buffers.length === 0) return result;
  return move({
    get [transferableSymbol]() {
      return buffers;
    },
    get [valueSymbol]() {
      return result;
    },
  });
}
