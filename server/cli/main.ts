// Entry point of the command line (`npm start`, `npx tsx server/cli/main.ts …`, bin/yieldloop.mjs).
import { run } from "./index.js";

await run(process.argv.slice(2));
