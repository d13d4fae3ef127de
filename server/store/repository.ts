// Every read and write of the store, as prepared statements; multi-row writes in one
// transaction. The seam where a PostgreSQL store would plug in (same methods).
import { GroupCommit } from "./group-commit.js";
import { timeOrderedId } from "./ids.js";
import type { Series } from "../../src/fit/series.js";
import type { Db } from "./database.js";

export type SpecKind = "model" | "rule" | "scenario";
export type ResultKind = "fit" | "analysis" | "projection" | "comparison";
export type JobStatus = "queued" | "running" | "done" | "failed" | "cancelled" | "interrupted";

export interface SeriesRecord {
  readonly id: string;
  readonly name: string;
  readonly contentHash: string;
  readonly years: number;
  readonly warnings: unknown[];
  readonly createdAt: string;
}

export interface SpecRecord {
  readonly id: string;
  readonly kind: SpecKind;
  readonly name: string;
  readonly spec: unknown;
  readonly createdAt: string;
}

export interface Provenance {
  readonly scenarioId: string | null;
  readonly seriesId: string | null;
  readonly dataHash: string | null;
  readonly programVersion: string;
  readonly seed: number | null;
}

export interface ResultRecord extends Provenance {
  readonly id: string;
  readonly kind: ResultKind;
  readonly request: unknown;
  readonly result: unknown;
  readonly createdAt: string;
}

export interface JobRecord {
  readonly id: string;
  readonly kind: string;
  readonly status: JobStatus;
  readonly progress: number;
  readonly request: unknown;
  readonly resultId: string | null;
  readonly error: unknown;
  readonly createdAt: string;
  readonly updatedAt: string;
}

export interface Page {
  readonly limit: number;
  readonly offset: number;
}

type Row = Record<string, unknown>;
const now = () => new Date().toISOString();
const json = (text: unknown) => (text === null || text === undefined ? null : JSON.parse(String(text)));

export class Repository {
  private readonly st;
  private readonly group: GroupCommit;

  constructor(readonly db: Db) {
    this.group = new GroupCommit(db);
    this.st = {
      insertSeries: db.prepare(
        "INSERT INTO series (id, name, csv, content_hash, years, warnings, created_at) VALUES (?, ?, ?, ?, ?, ?, ?)",
      ),
      insertSeriesRow: db.prepare(
        "INSERT INTO series_rows (series_id, row, year, count, catch, stocking, cv) VALUES (?, ?, ?, ?, ?, ?, ?)",
      ),
      getSeries: db.prepare(
        "SELECT id, name, content_hash, years, warnings, created_at FROM series WHERE id = ?",
      ),
      seriesCsv: db.prepare("SELECT csv FROM series WHERE id = ?"),
      seriesRows: db.prepare(
        "SELECT year, count, catch, stocking, cv FROM series_rows WHERE series_id = ? ORDER BY row",
      ),
      listSeries: db.prepare(
        "SELECT id, name, content_hash, years, warnings, created_at FROM series ORDER BY created_at, id LIMIT ? OFFSET ?",
      ),
      seriesByHash: db.prepare("SELECT id FROM series WHERE content_hash = ? AND name = ?"),
      deleteSeries: db.prepare("DELETE FROM series WHERE id = ?"),
      insertSpec: db.prepare("INSERT INTO specs (id, kind, name, spec, created_at) VALUES (?, ?, ?, ?, ?)"),
      getSpec: db.prepare("SELECT id, kind, name, spec, created_at FROM specs WHERE kind = ? AND id = ?"),
      specByName: db.prepare("SELECT id FROM specs WHERE kind = ? AND name = ?"),
      listSpecs: db.prepare(
        "SELECT id, kind, name, spec, created_at FROM specs WHERE kind = ? ORDER BY created_at, id LIMIT ? OFFSET ?",
      ),
      deleteSpec: db.prepare("DELETE FROM specs WHERE kind = ? AND id = ?"),
      insertResult: db.prepare(
        "INSERT INTO results (id, kind, request, result, scenario_id, series_id, data_hash, program_version, seed, created_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)",
      ),
      getResult: db.prepare("SELECT * FROM results WHERE kind = ? AND id = ?"),
      listResults: db.prepare(
        "SELECT id, kind, request, scenario_id, series_id, data_hash, program_version, seed, created_at FROM results WHERE kind = ? ORDER BY created_at, id LIMIT ? OFFSET ?",
      ),
      deleteResult: db.prepare("DELETE FROM results WHERE kind = ? AND id = ?"),
      insertJob: db.prepare(
        "INSERT INTO jobs (id, kind, status, progress, request, created_at, updated_at) VALUES (?, ?, 'queued', 0, ?, ?, ?)",
      ),
      getJob: db.prepare("SELECT * FROM jobs WHERE id = ?"),
      jobStatus: db.prepare(
        "UPDATE jobs SET status = ?, updated_at = ? WHERE id = ? AND status IN ('queued', 'running')",
      ),
      jobProgress: db.prepare(
        "UPDATE jobs SET progress = ?, updated_at = ? WHERE id = ? AND status = 'running'",
      ),
      jobDone: db.prepare(
        "UPDATE jobs SET status = 'done', progress = 1, result_id = ?, updated_at = ? WHERE id = ? AND status = 'running'",
      ),
      jobFailed: db.prepare(
        "UPDATE jobs SET status = 'failed', error = ?, updated_at = ? WHERE id = ? AND status IN ('queued', 'running')",
      ),
      interrupt: db.prepare(
        "UPDATE jobs SET status = 'interrupted', updated_at = ? WHERE status IN ('queued', 'running')",
      ),
    };
  }

  /** Stores a series and its rows in one transaction. */
  insertSeries(name: string, csv: string, contentHash: string, series: Series): SeriesRecord {
    const id = timeOrderedId();
    const createdAt = now();
    this.db.transaction(() => {
      this.st.insertSeries.run(
        id,
        name,
        csv,
        contentHash,
        series.years.length,
        JSON.stringify(series.warnings),
        createdAt,
      );
      series.years.forEach((year, i) => {
        this.st.insertSeriesRow.run(
          id,
          i,
          year,
          series.count[i],
          series.catch[i],
          series.stocking[i],
          series.cv[i],
        );
      });
    })();
    return { id, name, contentHash, years: series.years.length, warnings: series.warnings, createdAt };
  }

  getSeries(id: string): SeriesRecord | null {
    const r = this.st.getSeries.get(id) as Row | undefined;
    return r ? seriesRecord(r) : null;
  }

  seriesCsv(id: string): string | null {
    const r = this.st.seriesCsv.get(id) as { csv: string } | undefined;
    return r ? r.csv : null;
  }

  seriesRows(
    id: string,
  ): { year: number; count: number | null; catch: number; stocking: number; cv: number | null }[] {
    return this.st.seriesRows.all(id) as {
      year: number;
      count: number | null;
      catch: number;
      stocking: number;
      cv: number | null;
    }[];
  }

  seriesIdByHash(hash: string, name: string): string | null {
    const r = this.st.seriesByHash.get(hash, name) as { id: string } | undefined;
    return r ? r.id : null;
  }

  listSeries(page: Page): SeriesRecord[] {
    return (this.st.listSeries.all(page.limit, page.offset) as Row[]).map(seriesRecord);
  }

  deleteSeries(id: string): boolean {
    return this.st.deleteSeries.run(id).changes > 0;
  }

  insertSpec(kind: SpecKind, name: string, spec: unknown): SpecRecord {
    const id = timeOrderedId();
    const createdAt = now();
    this.st.insertSpec.run(id, kind, name, JSON.stringify(spec), createdAt);
    return { id, kind, name, spec, createdAt };
  }

  getSpec(kind: SpecKind, id: string): SpecRecord | null {
    const r = this.st.getSpec.get(kind, id) as Row | undefined;
    return r ? specRecord(r) : null;
  }

  specIdByName(kind: SpecKind, name: string): string | null {
    const r = this.st.specByName.get(kind, name) as { id: string } | undefined;
    return r ? r.id : null;
  }

  listSpecs(kind: SpecKind, page: Page): SpecRecord[] {
    return (this.st.listSpecs.all(kind, page.limit, page.offset) as Row[]).map(specRecord);
  }

  deleteSpec(kind: SpecKind, id: string): boolean {
    return this.st.deleteSpec.run(kind, id).changes > 0;
  }

  /**
   * Stores a result given as JSON text through the group commit (see group-commit.ts), for
   * results that requests store in large numbers; resolves with the row's id and time once
   * it has committed.
   */
  async insertResultText(
    kind: ResultKind,
    requestJson: string,
    resultJson: string,
    p: Provenance,
  ): Promise<{ id: string; createdAt: string }> {
    const id = timeOrderedId();
    const createdAt = now();
    await this.group.add(() => this.writeResult(id, kind, requestJson, resultJson, p, createdAt));
    return { id, createdAt };
  }

  insertResult(kind: ResultKind, request: unknown, result: unknown, provenance: Provenance): ResultRecord {
    const id = timeOrderedId();
    const createdAt = now();
    this.writeResult(id, kind, JSON.stringify(request), JSON.stringify(result), provenance, createdAt);
    return { id, kind, request, result, ...provenance, createdAt };
  }

  private writeResult(
    id: string,
    kind: ResultKind,
    requestJson: string,
    resultJson: string,
    p: Provenance,
    createdAt: string,
  ): void {
    this.st.insertResult.run(
      id,
      kind,
      requestJson,
      resultJson,
      p.scenarioId,
      p.seriesId,
      p.dataHash,
      p.programVersion,
      p.seed,
      createdAt,
    );
  }

  getResult(kind: ResultKind, id: string): ResultRecord | null {
    const r = this.st.getResult.get(kind, id) as Row | undefined;
    return r ? { ...resultSummary(r), result: json(r.result) } : null;
  }

  /** Results without their (possibly large) payloads. */
  listResults(kind: ResultKind, page: Page): Omit<ResultRecord, "result">[] {
    return (this.st.listResults.all(kind, page.limit, page.offset) as Row[]).map(resultSummary);
  }

  deleteResult(kind: ResultKind, id: string): boolean {
    return this.st.deleteResult.run(kind, id).changes > 0;
  }

  createJob(kind: string, request: unknown): JobRecord {
    const id = timeOrderedId();
    const t = now();
    this.st.insertJob.run(id, kind, JSON.stringify(request), t, t);
    return this.getJob(id)!;
  }

  getJob(id: string): JobRecord | null {
    const r = this.st.getJob.get(id) as Row | undefined;
    return r
      ? {
          id: String(r.id),
          kind: String(r.kind),
          status: r.status as JobStatus,
          progress: Number(r.progress),
          request: json(r.request),
          resultId: (r.result_id as string | null) ?? null,
          error: json(r.error),
          createdAt: String(r.created_at),
          updatedAt: String(r.updated_at),
        }
      : null;
  }

  /** Moves a queued or running job to another status; false if it had already ended. */
  setJobStatus(id: string, status: "running" | "cancelled"): boolean {
    return this.st.jobStatus.run(status, now(), id).changes > 0;
  }

  setJobProgress(id: string, progress: number): void {
    this.st.jobProgress.run(progress, now(), id);
  }

  /**
   * Stores a job's result and marks the job done in one transaction, so a crash leaves
   * either both or neither. Returns null (storing nothing) if the job was cancelled meanwhile.
   */
  finishJob(
    jobId: string,
    kind: ResultKind,
    request: unknown,
    result: unknown,
    provenance: Provenance,
  ): ResultRecord | null {
    const id = timeOrderedId();
    const createdAt = now();
    let stored = false;
    this.db.transaction(() => {
      const job = this.st.getJob.get(jobId) as Row | undefined;
      if (job?.status !== "running") return;
      this.writeResult(id, kind, JSON.stringify(request), JSON.stringify(result), provenance, createdAt);
      this.st.jobDone.run(id, createdAt, jobId);
      stored = true;
    })();
    return stored ? { id, kind, request, result, ...provenance, createdAt } : null;
  }

  failJob(id: string, error: unknown): void {
    this.st.jobFailed.run(JSON.stringify(error), now(), id);
  }

  /** Marks jobs left queued or running by a previous process as interrupted. */
  interruptUnfinishedJobs(): number {
    return this.st.interrupt.run(now()).changes;
  }
}

function seriesRecord(r: Row): SeriesRecord {
  return {
    id: String(r.id),
    name: String(r.name),
    contentHash: String(r.content_hash),
    years: Number(r.years),
    warnings: json(r.warnings) as unknown[],
    createdAt: String(r.created_at),
  };
}

function specRecord(r: Row): SpecRecord {
  return {
    id: String(r.id),
    kind: r.kind as SpecKind,
    name: String(r.name),
    spec: json(r.spec),
    createdAt: String(r.created_at),
  };
}

function resultSummary(r: Row): Omit<ResultRecord, "result"> {
  return {
    id: String(r.id),
    kind: r.kind as ResultKind,
    request: json(r.request),
    scenarioId: (r.scenario_id as string | null) ?? null,
    seriesId: (r.series_id as string | null) ?? null,
    dataHash: (r.data_hash as string | null) ?? null,
    programVersion: String(r.program_version),
    seed: r.seed === null || r.seed === undefined ? null : Number(r.seed),
    createdAt: String(r.created_at),
  };
}
