// `yieldloop`: the command line over the same core as the server.
import { parseArgs } from "node:util";
import { checkCommand, compareCommand, fitCommand, mapCommand, projectCommand } from "./commands.js";
import { CliError, EXIT } from "./exit-codes.js";
import { modelsHelp, rulesHelp } from "./help.js";
import { serve } from "./serve.js";

export const USAGE = `yieldloop — fit growth models to survey counts, test harvest rules, project stock and catch

usage:
  yieldloop serve   [--db FILE] [--host ADDRESS] [--port N] [--token TOKEN] [--workers N] [--demo]
  yieldloop fit     SERIES.csv [--families ricker,beverton-holt] [--delays 0,1] [--likelihood lognormal]
                    [--timing before|after] [--method observation|process] [--json] [--out FILE.csv]
  yieldloop check   SCENARIO.json [--json] [--out FILE.csv]
  yieldloop project SCENARIO.json [--replicates N] [--seed N] [--workers N] [--json] [--out FILE.csv]
  yieldloop compare SCENARIO.json [--rules RULES.json] [--replicates N] [--seed N] [--json] [--out FILE.csv]
  yieldloop map     SCENARIO.json --x PATH:FROM:TO:COUNT --y PATH:FROM:TO:COUNT [--json] [--out FILE.csv]
  yieldloop help [models|rules]

serve listens on 127.0.0.1:8470 unless told otherwise (YIELDLOOP_HOST, YIELDLOOP_PORT); any other
address needs an API token (--token or YIELDLOOP_TOKEN). The database is YIELDLOOP_DB or a file in
the user's data folder. A scenario file holds model, rule, start, horizon (and optionally startYear,
uncertainty and candidate rules under "alternatives"), as in data-demo/scenarios/; \`yieldloop help
models\` and \`yieldloop help rules\` list every growth family and harvest rule with their settings,
units and allowed ranges.

exit codes: 0 done; 1 the input was rejected (the message names the field or row); 2 the command
line was wrong; 3 an internal failure; 130 interrupted.`;

const OPTIONS = {
  db: { type: "string" },
  host: { type: "string" },
  port: { type: "string" },
  token: { type: "string" },
  workers: { type: "string" },
  demo: { type: "boolean" },
  json: { type: "boolean" },
  out: { type: "string" },
  families: { type: "string" },
  delays: { type: "string" },
  likelihood: { type: "string" },
  timing: { type: "string" },
  method: { type: "string" },
  replicates: { type: "string" },
  seed: { type: "string" },
  rules: { type: "string" },
  x: { type: "string" },
  y: { type: "string" },
  help: { type: "boolean", short: "h" },
} as const;

export async function main(argv: string[]): Promise<number> {
  let parsed: ReturnType<
    typeof parseArgs<{ args: string[]; options: typeof OPTIONS; allowPositionals: true; strict: true }>
  >;
  try {
    parsed = parseArgs({ args: argv, options: OPTIONS, allowPositionals: true, strict: true });
  } catch (e) {
    throw new CliError(`${(e as Error).message}\n\n${USAGE}`, EXIT.usage);
  }
  const [command, file, ...extra] = parsed.positionals;
  const o = parsed.values;
  if (command === "help" && (file === "models" || file === "rules")) {
    process.stdout.write(`${file === "models" ? modelsHelp() : rulesHelp()}\n`);
    return EXIT.ok;
  }
  if (!command || command === "help" || o.help) {
    process.stdout.write(`${USAGE}\n`);
    return command || o.help ? EXIT.ok : EXIT.usage;
  }
  const needFile = () => {
    if (!file) throw new CliError(`yieldloop ${command} needs a file\n\n${USAGE}`, EXIT.usage);
    if (extra.length) throw new CliError(`unexpected argument "${extra[0]}"`, EXIT.usage);
    return file;
  };
  switch (command) {
    case "serve":
      await serve(o);
      return -1; // keeps running
    case "fit":
      fitCommand(needFile(), o);
      return EXIT.ok;
    case "check":
      checkCommand(needFile(), o);
      return EXIT.ok;
    case "project":
      await projectCommand(needFile(), o);
      return EXIT.ok;
    case "compare":
      await compareCommand(needFile(), o);
      return EXIT.ok;
    case "map":
      await mapCommand(needFile(), o);
      return EXIT.ok;
    default:
      throw new CliError(`unknown command "${command}"\n\n${USAGE}`, EXIT.usage);
  }
}

export async function run(argv: string[]): Promise<void> {
  try {
    const code = await main(argv);
    if (code >= 0) process.exitCode = code;
  } catch (e) {
    if (e instanceof CliError) {
      process.stderr.write(`yieldloop: ${e.message}\n`);
      process.exitCode = e.code;
    } else {
      process.stderr.write(
        `yieldloop: internal error: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}\n`,
      );
      process.exitCode = EXIT.internal;
    }
  }
}
