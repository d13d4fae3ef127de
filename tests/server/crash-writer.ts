// Child process for crash-safety.test.ts: writes series of 400 rows and finished jobs into
// a real database file as fast as it can, printing each id once its transaction committed,
// until it is killed.
import { parseSeriesCsv } from "../../src/fit/series.js";
import { openDatabase } from "../../server/store/database.js";
import { Repository } from "../../server/store/repository.js";

const repo = new Repository(openDatabase(process.argv[2]!));
const csv =
  "year,count,catch\n" +
  Array.from({ length: 400 }, (_, i) => `${1600 + i},${100 + (i % 17)},${i % 5}`).join("\n");
const parsed = parseSeriesCsv(csv);
if (!parsed.ok) throw new Error("bad fixture");
const provenance = { scenarioId: null, seriesId: null, dataHash: null, programVersion: "test", seed: 1 };
for (let k = 0; ; k++) {
  const s = repo.insertSeries(`s${k}`, csv, `hash${k}`, parsed.value);
  const job = repo.createJob("projection", { k });
  repo.setJobStatus(job.id, "running");
  const big = { values: Array.from({ length: 2000 }, (_, i) => i * k) };
  const r = repo.finishJob(job.id, "projection", { k }, big, provenance);
  process.stdout.write(`${s.id} ${job.id} ${r!.id}\n`);
}
