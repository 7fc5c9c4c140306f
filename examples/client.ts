/**
 * A small lapwright client using only fetch (Node 20+, Deno, browsers). Copy it into a training
 * harness; it has no dependencies. 503 (busy) and 429 (rate limited) answers are retried after
 * their Retry-After, a few times; every other error becomes a LapwrightError with the service's
 * code, message and issues. A server with an API token gets it from the `token` option or the
 * LAPWRIGHT_API_TOKEN environment variable.
 *
 *   node --import tsx examples/client.ts [http://127.0.0.1:8080]
 * fetches the presets and one track of each (the Larkspur sim team's nightly curriculum).
 */

/** Request parameters (all optional; see GET /openapi.json for ranges and defaults). */
export interface TrackParams {
  seed?: number | string;
  lengthM?: number;
  widthM?: { min?: number; max?: number };
  curvatureBudgetDeg?: number;
  turnBalance?: number;
  cornerCount?: number;
  minCornerRadiusM?: number;
  noise?: number;
  gateSpacingM?: { min?: number; max?: number };
  spawnSlots?: number;
  wall?: { heightM?: number; thicknessM?: number };
  clearanceM?: number;
  car?: { lengthM?: number; widthM?: number };
}

/** The parts of a track (format lapwright.track/1) this example reads; the JSON has more. */
export interface Track {
  format: string;
  id: string;
  seed: number | string;
  generatorVersion: string;
  params: Required<Omit<TrackParams, 'seed'>> & { seed: number | string };
  centerline: { points: [number, number][]; spacingM: number; lengthM: number };
  walls: { left: [number, number][]; right: [number, number][]; heightM: number; thicknessM: number };
  gates: { index: number; s: number; left: [number, number]; right: [number, number]; forward: [number, number] }[];
  spawns: { index: number; position: [number, number]; headingDeg: number }[];
  metrics: { lengthM: number; cornerCount: number; gateCount: number; difficulty: number; [key: string]: unknown };
}

export interface Preset {
  name: string;
  description: string;
  params: TrackParams;
}

export interface Issue {
  path?: string;
  code?: string;
  message: string;
}

/** An error answer of the service: `code` is stable (ERR_INVALID_PARAMS, ERR_INFEASIBLE, ...). */
export class LapwrightError extends Error {
  readonly status: number;
  readonly code: string;
  readonly issues: Issue[];
  readonly reason?: string;
  readonly hint?: string;

  constructor(status: number, body: { code?: string; message?: string; issues?: Issue[]; reason?: string; hint?: string }) {
    super(`${status} ${body.code ?? 'error'}: ${body.message ?? ''}${body.hint ? ` (hint: ${body.hint})` : ''}`);
    this.name = 'LapwrightError';
    this.status = status;
    this.code = body.code ?? `HTTP_${status}`;
    this.issues = body.issues ?? [];
    this.reason = body.reason;
    this.hint = body.hint;
  }
}

export interface ClientOptions {
  /** 503 and 429 answers retried at most this many times (default 5). */
  retries?: number;
  /** API token of a server that requires one (default: the LAPWRIGHT_API_TOKEN environment variable). */
  token?: string;
  /** Longest wait for one answer, ms (default 60 s). */
  timeoutMs?: number;
}

/**
 * @example
 * const client = new LapwrightClient('http://127.0.0.1:8080');
 * const track = await client.track({ seed: 'larkspur-heldout-0042', lengthM: 3000 });
 */
export class LapwrightClient {
  private readonly base: string;
  private readonly retries: number;
  private readonly timeoutMs: number;
  private readonly token: string | undefined;

  constructor(baseUrl: string, options: ClientOptions = {}) {
    this.base = baseUrl.replace(/\/+$/, '');
    this.retries = options.retries ?? 5;
    this.timeoutMs = options.timeoutMs ?? 60_000;
    this.token = options.token ?? (envToken() || undefined);
  }

  /** GET /healthz. */
  health(): Promise<{ status: string; version: string; generatorVersion: string }> {
    return this.json('GET', '/healthz');
  }

  /** GET /v1/presets: the named difficulty presets, easiest first. */
  async presets(): Promise<Preset[]> {
    return (await this.json<{ presets: Preset[] }>('GET', '/v1/presets')).presets;
  }

  /** POST /v1/tracks: one track (a seed left out is drawn by the service and echoed in track.seed). */
  track(params: TrackParams = {}): Promise<Track> {
    return this.json('POST', '/v1/tracks', params);
  }

  /** GET /v1/tracks/{seed}: the same track, by a URL that caches and proxies can keep. */
  trackBySeed(seed: number | string, params: Omit<TrackParams, 'seed'> = {}): Promise<Track> {
    const query = new URLSearchParams(flatten(params)).toString();
    return this.json('GET', `/v1/tracks/${encodeURIComponent(String(seed))}${query ? `?${query}` : ''}`);
  }

  /** POST /v1/tracks/validate: check a track against every guarantee. */
  validate(track: unknown): Promise<{ valid: boolean; issues: Issue[] }> {
    return this.json('POST', '/v1/tracks/validate', track);
  }

  private async json<T>(method: string, path: string, body?: unknown): Promise<T> {
    for (let attempt = 0; ; attempt++) {
      const headers: Record<string, string> = { accept: 'application/json' };
      if (body !== undefined) headers['content-type'] = 'application/json';
      if (this.token !== undefined) headers.authorization = `Bearer ${this.token}`;
      const res = await fetch(`${this.base}${path}`, {
        method,
        headers,
        body: body === undefined ? undefined : JSON.stringify(body),
        signal: AbortSignal.timeout(this.timeoutMs),
      });
      if (res.ok) return (await res.json()) as T;
      const text = await res.text();
      // 503: the service is busy; 429: this client is over the rate limit. Both say when to come back
      if ((res.status === 503 || res.status === 429) && attempt < this.retries) {
        // the service says when to come back; wait at least that, a little more each time
        const after = Number(res.headers.get('retry-after') ?? '1');
        await new Promise((r) => setTimeout(r, (Number.isFinite(after) ? after : 1) * 1000 * (1 + attempt / 2)));
        continue;
      }
      let parsed: Record<string, unknown> = {};
      try {
        parsed = JSON.parse(text) as Record<string, unknown>;
      } catch {
        parsed = { message: text.slice(0, 200) };
      }
      throw new LapwrightError(res.status, parsed);
    }
  }
}

// LAPWRIGHT_API_TOKEN where there is an environment (Node, Deno with --allow-env); none in browsers
function envToken(): string | undefined {
  return (globalThis as { process?: { env?: Record<string, string | undefined> } }).process?.env?.LAPWRIGHT_API_TOKEN;
}

// nested parameters as dotted query keys: { widthM: { min: 8 } } → widthM.min=8
function flatten(params: Record<string, unknown>, prefix = ''): [string, string][] {
  return Object.entries(params).flatMap(([key, value]): [string, string][] =>
    value !== null && typeof value === 'object' ? flatten(value as Record<string, unknown>, `${prefix}${key}.`) : value === undefined ? [] : [[`${prefix}${key}`, String(value)]],
  );
}

// the nightly curriculum: one track of each preset, seeds named after the night
async function demo(baseUrl: string): Promise<void> {
  const client = new LapwrightClient(baseUrl);
  const health = await client.health();
  console.log(`lapwright ${health.version} (generator ${health.generatorVersion}) at ${baseUrl}`);
  for (const preset of await client.presets()) {
    const track = await client.track({ ...preset.params, seed: `larkspur-night-1202-${preset.name}` });
    console.log(`${preset.name.padEnd(10)} ${track.metrics.lengthM.toFixed(0)} m, ${track.metrics.cornerCount} corners, ${track.gates.length} gates, difficulty ${track.metrics.difficulty.toFixed(2)}, id ${track.id.slice(0, 12)}`);
  }
  try {
    await client.track({ turnBalance: 0, curvatureBudgetDeg: 900 });
  } catch (err) {
    if (!(err instanceof LapwrightError)) throw err;
    console.log(`refused as expected: ${err.code} (${err.reason}): ${err.hint}`);
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  demo(process.argv[2] ?? process.env.LAPWRIGHT_URL ?? 'http://127.0.0.1:8080').catch((err: Error) => {
    console.error(err.message);
    process.exitCode = 1;
  });
}
