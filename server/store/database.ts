// Opens the SQLite store: WAL journal, foreign keys on, migrations applied in a transaction.
import Database from "better-sqlite3";
import { mkdirSync } from "node:fs";
import { dirname } from "node:path";
import { MIGRATIONS } from "./migrations.js";

export type Db = Database.Database;

/** Opens (creating if needed) the database at `path`, or an in-memory one for ":memory:". */
export function openDatabase(path: string): Db {
  if (path !== ":memory:") mkdirSync(dirname(path), { recursive: true });
  const db = new Database(path);
  db.pragma("journal_mode = WAL");
  db.pragma("foreign_keys = ON");
  // NORMAL is durable across process crashes in WAL mode (a power cut may lose the last
  // transactions, never corrupt the file); it is SQLite's recommended setting for WAL.
  db.pragma("synchronous = NORMAL");
  db.pragma("busy_timeout = 5000");
  // 32 MB of page cache (the default is 2 MB): the indexes a busy server writes stay in memory.
  db.pragma("cache_size = -32000");
  migrate(db);
  return db;
}

/** Applies the migrations the database has not seen yet, each in its own transaction. */
export function migrate(db: Db): number {
  db.exec("CREATE TABLE IF NOT EXISTS schema_version (version INTEGER NOT NULL)");
  const row = db.prepare("SELECT MAX(version) AS v FROM schema_version").get() as { v: number | null };
  let version = row.v ?? 0;
  if (version > MIGRATIONS.length)
    throw new Error(
      `the database is at schema version ${version}, newer than this program (${MIGRATIONS.length}); use a newer yieldloop`,
    );
  const record = db.prepare("INSERT INTO schema_version (version) VALUES (?)");
  for (; version < MIGRATIONS.length; version++) {
    const sql = MIGRATIONS[version]!;
    db.transaction(() => {
      db.exec(sql);
      record.run(version + 1);
    })();
  }
  return version;
}
