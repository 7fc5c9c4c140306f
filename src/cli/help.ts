/**
 * Help texts of the CLI. The parameter list is read from the request schema's descriptions, so
 * ranges and defaults are stated once (core LIMITS and DEFAULTS).
 */
import { z } from 'zod';
import { SEED_MAX, SEED_STRING_MAX_CHARS } from '../core/index.js';
import { SVG_DEFAULT_WIDTH_PX, SVG_WIDTH_LIMITS_PX } from '../export/index.js';
import { trackRequestSchema } from '../schema/params.js';
import { BATCH_ENV_VARS } from '../server/batch-options.js';
import { ENV_VARS, SERVER_DEFAULTS } from '../server/config.js';

/** Exit codes of every command, as `--help` prints them. */
export const EXIT_CODES_TEXT = `Exit codes:
  0  success (validate: the track is valid)
  1  unexpected error (a failed write or a bug; a one-line message, never a stack trace)
  2  malformed input: bad flag, unreadable or invalid JSON, a field out of range (each named with its path)
  3  infeasible request: well-formed, but no valid track meets it (reason, message and hint on stderr)
  4  validate only: the track is well-formed but breaks a guarantee (issues on stdout);
     and verify: a track or file does not match its manifest (every mismatch on stdout)`;

/** `lapwright --help`. */
export function mainHelp(): string {
  return `Usage: lapwright <command> [options]

Closed racing tracks for training driving agents: seeded, validated, reproducible.

Commands:
  generate   generate one track and print it as JSON (or glb, SVG, CSV)
  validate   check a track file against every guarantee and print {valid, issues}
  serve      run the HTTP service until SIGTERM (see lapwright serve --help)
  batch      make a dataset: one file per track and manifest.json, on K worker threads
  verify     make every track of a manifest again and compare ids and files

Options:
  -h, --help  show this help; \`lapwright <command> --help\` shows a command's options
  --version   print the package version and the generator version

Data goes to stdout (or --out), messages to stderr.

${EXIT_CODES_TEXT}
`;
}

/** `lapwright generate --help`. */
export function generateHelp(): string {
  return `Usage: lapwright generate [--seed S] [--params FILE | -] [--set KEY=VALUE ...] [--out FILE]
                          [--format json|glb|svg|csv] [--pretty] [--table centerline|gates] [--width PX] [--heat]

Generates one track (format lapwright.track/1) and prints it to stdout, or writes it to --out: as
JSON by default, or exported as a glTF binary (glb), an SVG drawing or a CSV table.
The same seed, parameters and generator version give the same bytes.

Options:
  --seed S           integer 0..${SEED_MAX} or a string of 1..${SEED_STRING_MAX_CHARS} characters; digits that fit
                     are read as the integer, anything else as a string. Left out: drawn at random
                     and echoed in the track (track.seed).
  --params FILE | -  JSON object of parameters (- reads it from stdin)
  --set KEY=VALUE    set one parameter over --params; dotted keys reach nested fields
                     (--set widthM.min=8); numbers are parsed, anything else is a string; repeatable
  --out FILE         write the track to FILE instead of stdout (- is stdout)
  --format F         json (default): the track itself
                     glb: 3D scene (road, wall solids, gate trigger boxes, spawn nodes); binary, so
                          it goes to --out or a redirected stdout, never to a terminal
                     svg: a drawing (walls, gates, start line, spawns, corners, scale bar)
                     csv: a table, one row per centerline point (or per gate with --table gates)
  --pretty           json: indent (the default is one line)
  --table T          csv: centerline (default) or gates
  --width PX         svg: width in pixels, ${SVG_WIDTH_LIMITS_PX.min} to ${SVG_WIDTH_LIMITS_PX.max} (default ${SVG_DEFAULT_WIDTH_PX}); the height follows the track
  --heat             svg: colour the road by |curvature|
  -h, --help         show this help
Precedence: --params, then each --set in order, then --seed.

Parameters (all optional):
${parameterLines().join('\n')}

${EXIT_CODES_TEXT}
`;
}

/** `lapwright validate --help`. */
export function validateHelp(): string {
  return `Usage: lapwright validate [--pretty] TRACK.json | -

Checks a track (format lapwright.track/1) against every guarantee and prints {valid, issues} to stdout.
A malformed file (wrong types, missing fields) is input error 2; a well-formed track that breaks a
guarantee (crossing walls, radius below the minimum, ...) is exit 4 with the issues on stdout.

Options:
  --pretty    indent the JSON
  -h, --help  show this help

${EXIT_CODES_TEXT}
`;
}

/** `lapwright batch --help`. */
export function batchHelp(): string {
  return `Usage: lapwright batch --count N [--split train|validation|test] [--params RANGES.json] [--out DIR]
                       [--format json|glb|svg] [--workers K] [--shard i/n] [--base-seed S]
                       [--difficulty MIN:MAX] [--min-novelty RAD] [--reference MANIFEST.json]
                       [--request BATCH.json] [--force] [--quiet]
       lapwright batch --merge --out DIR

Makes a dataset: track-000000.json, track-000001.json, ... (or .glb, .svg) and manifest.json in
--out, the same tracks as POST /v1/batches with the same request. Every track's seed lies in
--split (a keyed hash of the seed: 80% train, 10% validation, 10% test), so a train set never
holds a test seed. Progress goes to stderr: a bar with tracks/s and ETA on a terminal, a plain
line per tenth of the work otherwise.

Options:
  --count N             tracks in the dataset (required)
  --split S             take only seeds of this split (default: any)
  --params FILE | -     JSON parameters of every track, as for generate, but each number may be a
                        range {"min": a, "max": b}, drawn from the track's own seed
  --base-seed S         root of the dataset's seeds (default: drawn at random, kept in the manifest)
  --difficulty MIN:MAX  keep only tracks whose difficulty lies in [MIN, MAX] (a curriculum stage's band)
  --min-novelty RAD     skip tracks closer than RAD (turning-function distance) to an earlier track
                        or to a --reference track
  --reference FILE      manifest of tracks the new ones must be novel against (e.g. the train set)
  --request FILE        a POST /v1/batches body (count, split, baseSeed, params, difficulty,
                        minNovelty); the flags above override its fields
  --out DIR             directory of the files (default .; created when missing)
  --format F            json (default), glb or svg
  --workers K           worker threads (default: the machine's cores; 0: none, all in this thread)
  --shard i/n           make shard i of n (0 <= i < n): the indices i, i+n, i+2n, ... of the same
                        dataset, files named as in the one-machine run, manifest.shard-i-of-n.json;
                        n machines with the same flags make exactly the one-machine dataset
  --merge               join the shard manifests in --out into manifest.json
  --force               write over an existing manifest
  --quiet               no progress or summary on stderr
  -h, --help            show this help

${EXIT_CODES_TEXT}
`;
}

/** `lapwright verify --help`. */
export function verifyHelp(): string {
  return `Usage: lapwright verify MANIFEST.json [--reference MANIFEST.json] [--min-novelty RAD] [--workers K] [--quiet]

Makes every track of a manifest again and checks that its seed, split and params follow from the
batch's request, that it has the manifest's id and shape, that the file beside the manifest holds
exactly its bytes (any edit is caught), that it lies in the difficulty band, and that it is at least
minNovelty from the tracks before it. With --reference, also that no seed or track is shared with
the reference manifest and that every track is at least minNovelty (or --min-novelty) from every
reference track: the proof that a test set is disjoint from and novel against a train set.
Every mismatch is one line on stdout; exit 4 when there is any.

Options:
  --reference FILE   a manifest the tracks must not share seeds or tracks with, and be novel against
  --min-novelty RAD  the distance to check against the reference (default: the manifest's minNovelty)
  --workers K        worker threads (default: the machine's cores; 0: none)
  --quiet            no progress on stderr
  -h, --help         show this help

${EXIT_CODES_TEXT}
`;
}

/** `lapwright serve --help`. */
export function serveHelp(): string {
  return `Usage: lapwright serve [--port N] [--host ADDRESS]

Runs the HTTP service (the same as npm start) until SIGTERM or SIGINT, then finishes the requests
in flight and exits 0. Logs are JSON lines (pino) on stdout. Endpoints: GET /docs once it runs.

Options:
  --port N          TCP port (default: $PORT, else ${SERVER_DEFAULTS.port}; 0 = any free port)
  --host ADDRESS    address to listen on (default: $HOST, else ${SERVER_DEFAULTS.host}; 0.0.0.0 for all)
  -h, --help        show this help

Environment:
${[...Object.values(ENV_VARS), ...Object.values(BATCH_ENV_VARS)]
  .map((v) => `  ${v.name.padEnd(33)} ${v.meaning} (default ${v.defaultText})`)
  .join('\n')}

Exit codes:
  0  shut down cleanly after SIGTERM or SIGINT
  1  could not listen, or in-flight requests did not finish within LAPWRIGHT_SHUTDOWN_TIMEOUT_MS
  2  a bad flag or environment variable
`;
}

// one line per leaf field of the request schema: dotted name and description
function parameterLines(): string[] {
  const rows: [string, string][] = [];
  for (const [key, field] of Object.entries(trackRequestSchema.shape)) {
    const inner = field.unwrap();
    if (inner instanceof z.ZodObject) {
      for (const [sub, subField] of Object.entries(inner.shape as Record<string, z.ZodType>)) rows.push([`${key}.${sub}`, subField.description ?? '']);
    } else {
      rows.push([key, field.description ?? '']);
    }
  }
  const width = Math.max(...rows.map(([name]) => name.length));
  return rows.map(([name, text]) => `  ${name.padEnd(width)}  ${text}`);
}
