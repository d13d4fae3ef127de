// Runs a reference script with python3 when python3 with numpy is present.
import { spawnSync } from "node:child_process";

/** True when `python3 -c "import numpy"` succeeds. */
export function havePythonNumpy(): boolean {
  const r = spawnSync("python3", ["-c", "import numpy"], { encoding: "utf8" });
  return r.status === 0;
}

/**
 * Runs bench/reference/<script> with arguments and returns its last stdout line parsed as
 * JSON. OPENBLAS_CORETYPE and OPENBLAS_L2_SIZE are removed for this call only, as they slow
 * a current numpy down on this machine kind.
 */
export function runReference(script: string, args: string[]): Record<string, unknown> {
  const env = { ...process.env };
  delete env.OPENBLAS_CORETYPE;
  delete env.OPENBLAS_L2_SIZE;
  const path = new URL(`./reference/${script}`, import.meta.url).pathname;
  const r = spawnSync("python3", [path, ...args], { encoding: "utf8", env, maxBuffer: 64 * 1024 * 1024 });
  if (r.status !== 0) throw new Error(`${script} failed: ${r.stderr}`);
  const lines = r.stdout.trim().split("\n");
  return JSON.parse(lines[lines.length - 1]!) as Record<string, unknown>;
}
