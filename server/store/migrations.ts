// The store's schema, one migration per entry, applied in order inside a transaction and
// recorded in schema_version. Never edit a migration that has shipped: add a new one.
export const MIGRATIONS: readonly string[] = [
  `
  CREATE TABLE series (
    id TEXT PRIMARY KEY,
    name TEXT NOT NULL,
    csv TEXT NOT NULL,
    content_hash TEXT NOT NULL,
    years INTEGER NOT NULL,
    warnings TEXT NOT NULL,
    created_at TEXT NOT NULL
  );
  CREATE TABLE series_rows (
    series_id TEXT NOT NULL REFERENCES series(id) ON DELETE CASCADE,
    row INTEGER NOT NULL,
    year INTEGER NOT NULL,
    count REAL,
    catch REAL NOT NULL,
    stocking REAL NOT NULL,
    cv REAL,
    PRIMARY KEY (series_id, row)
  );
  CREATE TABLE specs (
    id TEXT PRIMARY KEY,
    kind TEXT NOT NULL CHECK (kind IN ('model', 'rule', 'scenario')),
    name TEXT NOT NULL,
    spec TEXT NOT NULL,
    created_at TEXT NOT NULL
  );
  CREATE INDEX specs_by_kind ON specs(kind, created_at);
  CREATE TABLE results (
    id TEXT PRIMARY KEY,
    kind TEXT NOT NULL CHECK (kind IN ('fit', 'analysis', 'projection', 'comparison')),
    request TEXT NOT NULL,
    result TEXT NOT NULL,
    scenario_id TEXT REFERENCES specs(id) ON DELETE SET NULL,
    series_id TEXT REFERENCES series(id) ON DELETE SET NULL,
    data_hash TEXT,
    program_version TEXT NOT NULL,
    seed INTEGER,
    created_at TEXT NOT NULL
  );
  CREATE INDEX results_by_kind ON results(kind, created_at);
  CREATE TABLE jobs (
    id TEXT PRIMARY KEY,
    kind TEXT NOT NULL,
    status TEXT NOT NULL CHECK (status IN ('queued', 'running', 'done', 'failed', 'cancelled', 'interrupted')),
    progress REAL NOT NULL DEFAULT 0,
    request TEXT NOT NULL,
    result_id TEXT REFERENCES results(id) ON DELETE SET NULL,
    error TEXT,
    created_at TEXT NOT NULL,
    updated_at TEXT NOT NULL
  );
  `,
];
