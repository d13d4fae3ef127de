import { describe, expect, it } from "vitest";
import { openDatabase } from "../../server/store/database.js";
import { GroupCommit } from "../../server/store/group-commit.js";

// Group commit is a storage technique (one transaction for the writes of one event-loop
// turn); what it must keep is that each request's write either commits or fails on its own.
describe("group commit", () => {
  it("writes queued in one turn share a transaction; each resolves after its commit", async () => {
    const db = openDatabase(":memory:");
    db.exec("CREATE TABLE t (k INTEGER PRIMARY KEY, v TEXT NOT NULL)");
    const g = new GroupCommit(db);
    const ins = db.prepare("INSERT INTO t (k, v) VALUES (?, ?)");
    let commits = 0;
    const count = db.prepare("SELECT COUNT(*) AS n FROM t");
    const done = Array.from({ length: 50 }, (_, i) =>
      g
        .add(() => ins.run(i, `row ${i}`))
        .then(() => {
          commits++;
          return (count.get() as { n: number }).n;
        }),
    );
    // Nothing is written before the turn ends.
    expect((count.get() as { n: number }).n).toBe(0);
    const seen = await Promise.all(done);
    expect(commits).toBe(50);
    expect(seen.every((n) => n === 50)).toBe(true); // all 50 were visible when the first resolved: one transaction
    db.close();
  });

  it("a failing write fails alone: the others of its batch are stored", async () => {
    const db = openDatabase(":memory:");
    db.exec("CREATE TABLE t (k INTEGER PRIMARY KEY, v TEXT NOT NULL)");
    const g = new GroupCommit(db);
    const ins = db.prepare("INSERT INTO t (k, v) VALUES (?, ?)");
    const results = await Promise.allSettled([
      g.add(() => ins.run(1, "a")),
      g.add(() => ins.run(2, null)),
      g.add(() => ins.run(3, "c")),
    ]);
    expect(results.map((r) => r.status)).toEqual(["fulfilled", "rejected", "fulfilled"]);
    expect(String((results[1] as PromiseRejectedResult).reason)).toMatch(/NOT NULL/);
    expect(db.prepare("SELECT k FROM t ORDER BY k").all()).toEqual([{ k: 1 }, { k: 3 }]);
    db.close();
  });
});
