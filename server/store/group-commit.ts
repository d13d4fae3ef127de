// Group commit: the writes that many requests make in one turn of the event loop go into one
// transaction. In WAL mode every commit appends each page it changed in full (the table's
// last leaf, each index's last leaf), so a hundred one-row commits write those pages a
// hundred times and one hundred-row commit writes them once. A request is answered only
// after its transaction has committed, so nothing reported as stored can be lost.
import { TurnBatch } from "../turn-batch.js";
import type { Db } from "./database.js";

interface Pending {
  readonly write: () => void;
  readonly resolve: () => void;
  readonly reject: (e: unknown) => void;
}

export class GroupCommit {
  private readonly batch = new TurnBatch<Pending>((b) => this.flush(b));

  constructor(private readonly db: Db) {}

  /** Runs `write` inside the next group transaction; resolves once that has committed. */
  add(write: () => void): Promise<void> {
    return new Promise<void>((resolve, reject) => this.batch.add({ write, resolve, reject }));
  }

  private flush(batch: Pending[]): void {
    try {
      this.db.transaction(() => {
        for (const p of batch) p.write();
      })();
      for (const p of batch) p.resolve();
    } catch {
      // One failing write must not fail the others: each goes again in its own transaction.
      for (const p of batch) {
        try {
          this.db.transaction(p.write)();
          p.resolve();
        } catch (e) {
          p.reject(e);
        }
      }
    }
  }
}
