import { spawn } from "node:child_process";
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import Database from "better-sqlite3";
import { describe, expect, it } from "vitest";

// A real child process writing to a real database file is killed with SIGKILL mid-write.
// SQLite's atomic commit (https://www.sqlite.org/atomiccommit.html, WAL mode) promises that
// every committed transaction survives and no partial one is visible; this checks our use
// of it: each multi-row write is one transaction.
describe("a process killed with SIGKILL during writes", () => {
  it("loses no committed data and leaves no partial rows", async () => {
    const file = join(mkdtempSync(join(tmpdir(), "yieldloop-crash-")), "store.db");
    const child = spawn(
      process.execPath,
      ["--import", "tsx", fileURLToPath(new URL("./crash-writer.ts", import.meta.url)), file],
      { stdio: ["ignore", "pipe", "inherit"] },
    );
    const committed: string[][] = [];
    let buffer = "";
    await new Promise<void>((resolve, reject) => {
      child.on("error", reject);
      child.stdout!.on("data", (chunk: Buffer) => {
        buffer += chunk.toString("utf8");
        const lines = buffer.split("\n");
        buffer = lines.pop()!;
        for (const l of lines) committed.push(l.split(" "));
        if (committed.length >= 40 && !child.killed) {
          child.kill("SIGKILL");
          resolve();
        }
      });
      child.on("exit", () => resolve());
    });
    await new Promise((r) => child.once("exit", r));
    expect(child.signalCode).toBe("SIGKILL");
    const db = new Database(file);
    expect(db.pragma("integrity_check", { simple: true })).toBe("ok");
    // Every id the child reported as committed is there, complete.
    for (const [seriesId, jobId, resultId] of committed) {
      const s = db.prepare("SELECT years FROM series WHERE id = ?").get(seriesId) as
        | { years: number }
        | undefined;
      expect(s?.years).toBe(400);
      expect(
        (
          db.prepare("SELECT COUNT(*) AS n FROM series_rows WHERE series_id = ?").get(seriesId) as {
            n: number;
          }
        ).n,
      ).toBe(400);
      expect(
        (
          db.prepare("SELECT status, result_id FROM jobs WHERE id = ?").get(jobId) as {
            status: string;
            result_id: string;
          }
        ).result_id,
      ).toBe(resultId);
    }
    // Nothing partial: every series has all its rows, every done job its result, every result parses.
    const partial = db
      .prepare(
        "SELECT s.id FROM series s LEFT JOIN series_rows r ON r.series_id = s.id GROUP BY s.id HAVING COUNT(r.row) <> s.years",
      )
      .all();
    expect(partial).toEqual([]);
    const orphanRows = db
      .prepare("SELECT COUNT(*) AS n FROM series_rows WHERE series_id NOT IN (SELECT id FROM series)")
      .get() as { n: number };
    expect(orphanRows.n).toBe(0);
    const doneWithout = db
      .prepare(
        "SELECT COUNT(*) AS n FROM jobs WHERE status = 'done' AND result_id NOT IN (SELECT id FROM results)",
      )
      .get() as { n: number };
    expect(doneWithout.n).toBe(0);
    for (const r of db.prepare("SELECT result FROM results").all() as { result: string }[])
      expect(() => JSON.parse(r.result)).not.toThrow();
    db.close();
  }, 60_000);
});
