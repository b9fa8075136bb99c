// A thin client of CouchDB's documented HTTP interfaces, only the calls replication needs:
// `_session` (cookie login), database create, `_bulk_docs`, `_all_docs` with keys, `_changes`,
// `_bulk_get`, `_local` documents and `_replicate`. Every answer is read with a byte limit and a
// time limit, and every failure becomes a CouchError whose kind says what the laptop should show
// and whether to try again. docs/dev/sync.md says why a thin client and not PouchDB.

export type CouchErrorKind =
  | 'offline' // no answer: network down, server stopped, connection cut
  | 'timeout' // the server did not finish answering in time
  | 'unauthorized' // 401: not logged in or the session expired
  | 'forbidden' // 403: the user may not use this database
  | 'not-found' // 404
  | 'conflict' // 409
  | 'server' // 5xx or another unexpected status
  | 'garbage' // an answer that is not the JSON CouchDB sends (truncated, HTML, nonsense)
  | 'too-large'; // an answer over the byte limit

export class CouchError extends Error {
  readonly kind: CouchErrorKind;
  readonly status: number | null;
  constructor(kind: CouchErrorKind, message: string, status: number | null = null) {
    super(message);
    this.name = 'CouchError';
    this.kind = kind;
    this.status = status;
  }
  /** Worth trying again later without anyone doing anything. */
  get retryable(): boolean {
    return this.kind === 'offline' || this.kind === 'timeout' || this.kind === 'server' || this.kind === 'garbage' || this.kind === 'conflict';
  }
}

export interface CouchOptions {
  /** The server's base address; a trailing slash is added when missing. */
  url: string;
  fetch?: typeof fetch;
  /** Per request; long polls add their own wait. Default 30 s. */
  timeoutMs?: number;
  /** Largest answer read; a larger one is a `too-large` error. Default 64 MiB. */
  maxResponseBytes?: number;
  /**
   * 'browser': the browser keeps the session cookie (requests carry credentials); 'manual': this
   * client keeps it in memory and sends it (Node). Default: 'browser' where there is a document.
   */
  cookies?: 'browser' | 'manual';
}

export interface ChangesResult {
  results: { seq: unknown; id: string; deleted?: boolean; doc?: unknown }[];
  last_seq: unknown;
  pending?: number;
}

export interface BulkDocsResult {
  id: string;
  ok?: boolean;
  error?: string;
  reason?: string;
}

/** A `seq` as text: CouchDB 3 sends opaque strings, PouchDB Server numbers. */
export function seqText(seq: unknown): string {
  return typeof seq === 'string' ? seq : JSON.stringify(seq ?? 0);
}

function statusError(msg: string, status: number): CouchError {
  const kind: CouchErrorKind = status === 401 ? 'unauthorized' : status === 403 ? 'forbidden' : status === 404 ? 'not-found' : status === 409 ? 'conflict' : status === 413 ? 'too-large' : 'server';
  return new CouchError(kind, msg, status);
}

function decodeText(bytes: Uint8Array, where: string, status: number): string {
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw new CouchError('garbage', `${where}: the answer is not UTF-8 text`, status);
  }
}

const isObject = (v: unknown): v is Record<string, unknown> => v !== null && typeof v === 'object' && !Array.isArray(v);

export class CouchClient {
  readonly base: string;
  private readonly fetchFn: typeof fetch;
  private readonly timeoutMs: number;
  private readonly maxBytes: number;
  private readonly manualCookies: boolean;
  private cookie: string | null = null;

  constructor(opts: CouchOptions) {
    this.base = opts.url.endsWith('/') ? opts.url : `${opts.url}/`;
    const u = new URL(this.base);
    if (u.protocol !== 'http:' && u.protocol !== 'https:') throw new CouchError('server', `the server address must start with http:// or https://, not ${u.protocol}`);
    if (u.username || u.password) throw new CouchError('server', 'give the user and password separately, not inside the server address');
    this.fetchFn = opts.fetch ?? ((...a) => fetch(...a));
    this.timeoutMs = opts.timeoutMs ?? 30_000;
    this.maxBytes = opts.maxResponseBytes ?? 64 * 1024 * 1024;
    this.manualCookies = (opts.cookies ?? (typeof document === 'undefined' ? 'manual' : 'browser')) === 'manual';
  }

  /** The server's origin, for the page's connect-src. */
  get origin(): string {
    return new URL(this.base).origin;
  }

  dbUrl(db: string): string {
    return `${this.base}${encodeURIComponent(db)}`;
  }

  /** One exchange: the answer's status, headers and body (at most `maxBytes`), or a CouchError. */
  private async exchange(method: string, path: string, body: unknown, accept: string, timeout: number, maxBytes: number): Promise<{ res: Response; bytes: Uint8Array; where: string }> {
    const headers: Record<string, string> = { accept };
    if (body !== undefined) headers['content-type'] = 'application/json';
    if (this.manualCookies && this.cookie) headers.cookie = this.cookie;
    const controller = new AbortController();
    const timer = setTimeout(() => controller.abort(), timeout);
    const where = `${method} ${path.split('?')[0]}`;
    try {
      const text = body === undefined ? undefined : JSON.stringify(body);
      const send = () => this.fetchFn(`${this.base}${path}`, { method, headers, body: text, signal: controller.signal, credentials: this.manualCookies ? 'omit' : 'include', cache: 'no-store' });
      let res: Response;
      try {
        try {
          res = await send();
        } catch (e) {
          // Once more at once: Node's fetch may reuse a kept-alive connection the server has just
          // closed ("other side closed"), which a browser retries by itself. Every call here may
          // be repeated: documents are immutable (a repeat is "already there").
          if (controller.signal.aborted) throw e;
          res = await send();
        }
      } catch (e) {
        if (controller.signal.aborted) throw new CouchError('timeout', `${where}: no answer within ${Math.round(timeout / 1000)} s`);
        throw new CouchError('offline', `${where}: the server cannot be reached (${e instanceof Error ? e.message : String(e)})`);
      }
      if (this.manualCookies) {
        const set = res.headers.get('set-cookie');
        const m = set ? /AuthSession=[^;]*/.exec(set) : null;
        if (m) this.cookie = m[0];
      }
      return { res, bytes: await this.readBytes(res, maxBytes, where, controller, timeout), where };
    } finally {
      clearTimeout(timer);
    }
  }

  /** One request; the answer's JSON, or a CouchError. */
  async request(method: string, path: string, body?: unknown, opts: { timeoutMs?: number; maxBytes?: number; okStatuses?: number[] } = {}): Promise<unknown> {
    const { res, bytes, where } = await this.exchange(method, path, body, 'application/json', opts.timeoutMs ?? this.timeoutMs, opts.maxBytes ?? this.maxBytes);
    const text = decodeText(bytes, where, res.status);
    let data: unknown = null;
    let parsed = true;
    try {
      data = text === '' ? null : JSON.parse(text);
    } catch {
      parsed = false;
    }
    const ok = res.ok || (opts.okStatuses?.includes(res.status) ?? false);
    if (!ok) {
      const reason = parsed && isObject(data) ? [data.error, data.reason].filter((x) => typeof x === 'string').join(': ') : text.slice(0, 120);
      throw statusError(`${where}: HTTP ${res.status}${reason ? ` (${reason})` : ''}`, res.status);
    }
    if (!parsed) throw new CouchError('garbage', `${where}: the answer is not JSON (${text.length} characters, starting ${JSON.stringify(text.slice(0, 40))})`, res.status);
    return data;
  }

  /**
   * An attachment's bytes (`GET /db/doc/name`), at most `maxBytes`, and the type the server
   * gives; a larger one is a `too-large` error, read no further than the limit.
   */
  async attachment(db: string, docId: string, name: string, maxBytes: number): Promise<{ bytes: Uint8Array; contentType: string }> {
    const path = `${encodeURIComponent(db)}/${encodeURIComponent(docId)}/${encodeURIComponent(name)}`;
    const { res, bytes, where } = await this.exchange('GET', path, undefined, '*/*', this.timeoutMs, maxBytes);
    if (!res.ok) throw statusError(`${where}: HTTP ${res.status}`, res.status);
    return { bytes, contentType: (res.headers.get('content-type') ?? '').split(';')[0]?.trim().toLowerCase() ?? '' };
  }

  /** The body, at most `max` bytes; a cut connection or a stall is an error, never a short body. */
  private async readBytes(res: Response, max: number, where: string, controller: AbortController, timeout: number): Promise<Uint8Array> {
    const declared = Number(res.headers.get('content-length'));
    if (Number.isFinite(declared) && declared > max) {
      controller.abort();
      throw new CouchError('too-large', `${where}: the answer has ${declared} bytes, more than the limit of ${max}`, res.status);
    }
    if (!res.body) return new Uint8Array(0);
    const reader = res.body.getReader();
    const chunks: Uint8Array[] = [];
    let size = 0;
    try {
      for (;;) {
        const { done, value } = await reader.read();
        if (done) break;
        size += value.byteLength;
        if (size > max) {
          controller.abort();
          throw new CouchError('too-large', `${where}: the answer is over the limit of ${max} bytes`, res.status);
        }
        chunks.push(value);
      }
    } catch (e) {
      if (e instanceof CouchError) throw e;
      if (controller.signal.aborted) throw new CouchError('timeout', `${where}: the answer did not finish within ${Math.round(timeout / 1000)} s`);
      throw new CouchError('garbage', `${where}: the answer was cut off after ${size} bytes`, res.status);
    }
    const all = new Uint8Array(size);
    let at = 0;
    for (const c of chunks) {
      all.set(c, at);
      at += c.byteLength;
    }
    return all;
  }

  /** Logs in with a CouchDB session cookie. The password is used for this request only. */
  async logIn(name: string, password: string): Promise<{ name: string; roles: string[] }> {
    const r = await this.request('POST', '_session', { name, password });
    if (!isObject(r) || r.ok !== true) throw new CouchError('garbage', 'POST _session: the answer is not a session');
    return { name: typeof r.name === 'string' ? r.name : name, roles: Array.isArray(r.roles) ? r.roles.filter((x): x is string => typeof x === 'string') : [] };
  }

  /** Who the session is (null: not logged in). */
  async sessionUser(): Promise<string | null> {
    const r = await this.request('GET', '_session');
    const ctx = isObject(r) && isObject(r.userCtx) ? r.userCtx : null;
    return ctx && typeof ctx.name === 'string' ? ctx.name : null;
  }

  async logOut(): Promise<void> {
    await this.request('DELETE', '_session');
    this.cookie = null;
  }

  /** Creates the database when it is missing (needs a server admin on a real CouchDB). */
  async ensureDatabase(db: string): Promise<void> {
    try {
      await this.request('GET', encodeURIComponent(db));
      return;
    } catch (e) {
      if (!(e instanceof CouchError && e.kind === 'not-found')) throw e;
    }
    try {
      await this.request('PUT', encodeURIComponent(db));
    } catch (e) {
      // 412: created meanwhile by another laptop.
      if (e instanceof CouchError && e.status === 412) return;
      if (e instanceof CouchError && (e.kind === 'unauthorized' || e.kind === 'forbidden')) {
        throw new CouchError(e.kind, `the database ${db} does not exist on the server and this user may not create it: ask the server's admin to create it (docs: README, "A real CouchDB")`, e.status);
      }
      throw e;
    }
  }

  /** Writes new documents; a document that exists already comes back as a `conflict` entry. */
  async bulkDocs(db: string, docs: readonly unknown[]): Promise<BulkDocsResult[]> {
    const r = await this.request('POST', `${encodeURIComponent(db)}/_bulk_docs`, { docs });
    if (!Array.isArray(r)) throw new CouchError('garbage', 'POST _bulk_docs: the answer is not a list');
    return r.map((x) => {
      const o = isObject(x) ? x : {};
      const out: BulkDocsResult = { id: typeof o.id === 'string' ? o.id : '' };
      if (o.ok === true) out.ok = true;
      if (typeof o.error === 'string') out.error = o.error;
      if (typeof o.reason === 'string') out.reason = o.reason;
      return out;
    });
  }

  /** Which of the given ids the database holds (`_all_docs` with keys). */
  async existing(db: string, ids: readonly string[]): Promise<Set<string>> {
    const r = await this.request('POST', `${encodeURIComponent(db)}/_all_docs`, { keys: ids });
    if (!isObject(r) || !Array.isArray(r.rows)) throw new CouchError('garbage', 'POST _all_docs: the answer has no rows');
    const out = new Set<string>();
    for (const row of r.rows) if (isObject(row) && typeof row.id === 'string' && !row.error && !(isObject(row.value) && row.value.deleted)) out.add(row.id);
    return out;
  }

  /** One page of the changes feed; with `waitMs` a long poll that returns at the first change. */
  async changes(db: string, q: { since: string; limit: number; includeDocs: boolean; waitMs?: number }): Promise<ChangesResult> {
    const params = new URLSearchParams({ since: q.since, limit: String(q.limit), include_docs: String(q.includeDocs) });
    if (q.waitMs !== undefined) {
      params.set('feed', 'longpoll');
      params.set('timeout', String(q.waitMs));
    }
    const r = await this.request('GET', `${encodeURIComponent(db)}/_changes?${params}`, undefined, { timeoutMs: this.timeoutMs + (q.waitMs ?? 0) });
    if (!isObject(r) || !Array.isArray(r.results) || !('last_seq' in r)) throw new CouchError('garbage', 'GET _changes: the answer is not a changes feed');
    const results: ChangesResult['results'] = [];
    for (const x of r.results) {
      if (!isObject(x) || typeof x.id !== 'string') throw new CouchError('garbage', 'GET _changes: a result without an id');
      const item: ChangesResult['results'][number] = { seq: x.seq, id: x.id };
      if (x.deleted === true) item.deleted = true;
      if ('doc' in x) item.doc = x.doc;
      results.push(item);
    }
    const out: ChangesResult = { results, last_seq: r.last_seq };
    if (typeof r.pending === 'number') out.pending = r.pending;
    return out;
  }

  /** Documents by id (`_bulk_get`); a document the server cannot give is left out. */
  async bulkGet(db: string, ids: readonly string[], maxBytes?: number): Promise<unknown[]> {
    const r = await this.request('POST', `${encodeURIComponent(db)}/_bulk_get`, { docs: ids.map((id) => ({ id })) }, maxBytes === undefined ? {} : { maxBytes });
    if (!isObject(r) || !Array.isArray(r.results)) throw new CouchError('garbage', 'POST _bulk_get: the answer has no results');
    const out: unknown[] = [];
    for (const res of r.results) {
      if (!isObject(res) || !Array.isArray(res.docs)) continue;
      for (const d of res.docs) if (isObject(d) && isObject(d.ok)) out.push(d.ok);
    }
    return out;
  }

  async getLocal(db: string, id: string): Promise<Record<string, unknown> | null> {
    try {
      const r = await this.request('GET', `${encodeURIComponent(db)}/${id}`);
      return isObject(r) ? r : null;
    } catch (e) {
      if (e instanceof CouchError && e.kind === 'not-found') return null;
      throw e;
    }
  }

  /** Writes a `_local` document, taking the current revision first (they are not replicated). */
  async putLocal(db: string, id: string, body: Record<string, unknown>): Promise<void> {
    const current = await this.getLocal(db, id);
    const doc: Record<string, unknown> = { ...body, _id: id };
    if (current && typeof current._rev === 'string') doc._rev = current._rev;
    await this.request('PUT', `${encodeURIComponent(db)}/${id}`, doc);
  }

  /** Server-side replication (`POST /_replicate`), e.g. ship to shore. */
  async replicate(source: string, target: string, opts: { createTarget?: boolean; timeoutMs?: number } = {}): Promise<Record<string, unknown>> {
    const r = await this.request('POST', '_replicate', { source, target, create_target: opts.createTarget ?? false }, { timeoutMs: opts.timeoutMs ?? 600_000 });
    if (!isObject(r)) throw new CouchError('garbage', 'POST _replicate: the answer is not an object');
    return r;
  }
}
