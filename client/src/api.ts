// The page's only way to the numbers: the HTTP API. Errors arrive as RFC 9457 problems.

export interface Problem {
  readonly type: string;
  readonly title: string;
  readonly status: number;
  readonly detail: string;
  readonly field?: string;
  readonly row?: number;
  readonly column?: string;
  /** For a CSV: every problem, row by row. */
  readonly problems?: { row?: number; column?: string; detail: string }[];
}

export class ApiError extends Error {
  constructor(readonly problem: Problem) {
    super(problem.detail);
  }
}

async function parse<T>(res: Response): Promise<T> {
  const type = res.headers.get("content-type") ?? "";
  if (!res.ok) {
    const body = type.includes("json")
      ? ((await res.json()) as Problem)
      : { type: "about:blank", title: res.statusText, status: res.status, detail: await res.text() };
    throw new ApiError(body);
  }
  if (res.status === 204) return undefined as T;
  return (type.includes("json") ? await res.json() : await res.text()) as T;
}

export async function getJson<T>(path: string): Promise<T> {
  return parse<T>(await fetch(path, { headers: { Accept: "application/json" } }));
}

export async function postJson<T>(path: string, body: unknown, signal?: AbortSignal): Promise<T> {
  return parse<T>(
    await fetch(path, {
      method: "POST",
      headers: { "Content-Type": "application/json" },
      body: JSON.stringify(body),
      ...(signal ? { signal } : {}),
    }),
  );
}

export async function postCsv<T>(path: string, csv: string): Promise<T> {
  return parse<T>(await fetch(path, { method: "POST", headers: { "Content-Type": "text/csv" }, body: csv }));
}

export async function del(path: string): Promise<void> {
  await parse<void>(await fetch(path, { method: "DELETE" }));
}

export interface JobView {
  readonly id: string;
  readonly status: string;
  readonly progress: number;
  readonly resultId: string | null;
  readonly error: unknown;
  readonly links: { self: string; events: string; result?: string };
}

/**
 * Follows a job through its server-sent events until it ends; `onProgress` gets 0…1.
 * Resolves with the final job (done, failed or cancelled).
 */
export function watchJob(job: JobView, onProgress: (f: number) => void): Promise<JobView> {
  return new Promise((resolve, reject) => {
    const source = new EventSource(job.links.events);
    source.addEventListener("progress", (e) =>
      onProgress((JSON.parse((e as MessageEvent).data) as { progress: number }).progress),
    );
    source.addEventListener("status", (e) =>
      onProgress((JSON.parse((e as MessageEvent).data) as JobView).progress),
    );
    source.addEventListener("end", (e) => {
      source.close();
      resolve(JSON.parse((e as MessageEvent).data) as JobView);
    });
    source.onerror = () => {
      source.close();
      // The stream broke (a restart, a proxy): read the job's stored state instead.
      getJson<JobView>(job.links.self).then(resolve, reject);
    };
  });
}
