// Tests for src/cli/main.ts: the lapwright command line, run in-process with captured streams.

import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main.js';
import { generateTrack, GENERATOR_VERSION, SEED_MAX } from '../../src/core/index.js';
import type { Track } from '../../src/core/index.js';

interface Run {
  code: number;
  stdout: string;
  stderr: string;
}

/** A sink that keeps what is written (and can fail every write, for the exit 1 test). */
function capture(failWith?: Error) {
  const sink = {
    text: '',
    write(chunk: string, callback: (error?: Error | null) => void): boolean {
      if (failWith) {
        callback(failWith);
        return false;
      }
      sink.text += chunk;
      callback();
      return true;
    },
  };
  return sink;
}

async function run(argv: string[], stdinText = ''): Promise<Run> {
  const stdout = capture();
  const stderr = capture();
  const code = await runCli(argv, { stdout, stderr, stdin: Readable.from([stdinText]) });
  return { code, stdout: stdout.text, stderr: stderr.text };
}

let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'lapwright-cli-'));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

async function file(name: string, text: string): Promise<string> {
  const path = join(dir, name);
  await writeFile(path, text);
  return path;
}

describe('help and version', () => {
  it('--version prints the package version and the generator version', async () => {
    const pkg = JSON.parse(await readFile(new URL('../../package.json', import.meta.url), 'utf8')) as { version: string };
    expect(await run(['--version'])).toEqual({ code: 0, stdout: `lapwright ${pkg.version} (generatorVersion ${GENERATOR_VERSION})\n`, stderr: '' });
  });

  it('--help, -h and help print the usage and exit codes to stdout', async () => {
    for (const argv of [['--help'], ['-h'], ['help']]) {
      const r = await run(argv);
      expect(r.code).toBe(0);
      expect(r.stdout).toMatch(/^Usage: lapwright <command> \[options\]\n/);
      expect(r.stdout).toContain('  4  validate only: the track is well-formed but breaks a guarantee');
      expect(r.stderr).toBe('');
    }
  });

  it('<command> --help and help <command> print that command\'s options', async () => {
    const generate = await run(['generate', '--help']);
    expect(generate.code).toBe(0);
    expect(generate.stdout).toMatch(/^Usage: lapwright generate /);
    expect(generate.stdout).toContain('  widthM.min            Narrowest road width. Unit: metres. Allowed: 3 to 40. Default: 10.');
    expect((await run(['help', 'generate'])).stdout).toBe(generate.stdout);
    const validate = await run(['validate', '-h']);
    expect(validate.code).toBe(0);
    expect(validate.stdout).toMatch(/^Usage: lapwright validate /);
  });

  it('no command prints the usage to stderr and exits 2', async () => {
    const r = await run([]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/^Usage: lapwright <command>/);
  });
});

describe('exit 2: malformed input, one line per problem on stderr', () => {
  const cases: [string, string[], string][] = [
    ['unknown command', ['make'], 'lapwright: unknown command "make" (see lapwright --help)'],
    ['option before the command', ['--seed', '7'], 'lapwright: unknown option --seed; options go after the command (see lapwright --help)'],
    ['batch without --count', ['batch'], 'lapwright batch: --count is required (see lapwright batch --help)'],
    ['unknown flag', ['generate', '--colour', 'red'], 'lapwright generate: unknown option --colour (see lapwright generate --help)'],
    ['file argument to generate', ['generate', 'params.json'], 'lapwright generate: generate takes no file arguments, got "params.json" (parameters go in --params FILE or --set KEY=VALUE)'],
    ['--set without =', ['generate', '--set', 'noise'], 'lapwright generate: --set expects key=value (e.g. widthM.min=8), got "noise"'],
    ['--set into a number', ['generate', '--set', 'noise=0.1', '--set', 'noise.x=1'], 'lapwright generate: --set noise.x: noise is 0.1, not an object'],
    ['validate without a file', ['validate'], 'lapwright validate: validate takes one track file (or - for stdin), got 0 (see lapwright validate --help)'],
    ['validate with two files', ['validate', 'a.json', 'b.json'], 'lapwright validate: validate takes one track file (or - for stdin), got 2 (see lapwright validate --help)'],
    ['unknown flag to validate', ['validate', '--fix', 'a.json'], 'lapwright validate: unknown option --fix (see lapwright validate --help)'],
  ];
  for (const [what, argv, line] of cases) {
    it(what, async () => {
      expect(await run(argv)).toEqual({ code: 2, stdout: '', stderr: `${line}\n` });
    });
  }

  it('a flag missing its value', async () => {
    const r = await run(['generate', '--seed']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/^lapwright generate: .*--seed.* \(see lapwright generate --help\)\n$/);
  });

  it('every bad field is named with its path, one per line', async () => {
    const r = await run(['generate', '--set', 'widthM.min=2', '--set', 'lengthM=long', '--set', 'wall.colour=red', '--set', 'laps=3', '--set', 'gateSpacingM.min=30', '--set', 'gateSpacingM.max=20']);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.split('\n')).toMatchInlineSnapshot(`
      [
        "lapwright generate: invalid parameters (ERR_INVALID_PARAMS)",
        "  lengthM: expected a number from 300 to 20000 m, got "long"",
        "  widthM.min: expected a number from 3 to 40 m, got 2",
        "  gateSpacingM: min 30 m is greater than max 20 m",
        "  wall.colour: unknown field "colour"; allowed fields: heightM, thicknessM",
        "  laps: unknown field "laps"; allowed fields: seed, lengthM, widthM, curvatureBudgetDeg, turnBalance, cornerCount, minCornerRadiusM, noise, gateSpacingM, spawnSlots, wall, clearanceM, car, vehicle, drivability, sensors",
        "",
      ]
    `);
  });

  it('a bad --seed is named at seed', async () => {
    const r = await run(['generate', '--seed', 'x'.repeat(65)]);
    expect(r.code).toBe(2);
    expect(r.stderr.split('\n')[1]).toBe('  seed: expected an integer from 0 to 4294967295 or a string of 1 to 64 characters, got "xxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxx"... (65 characters)');
  });

  it('an unreadable --params file', async () => {
    const missing = join(dir, 'missing.json');
    const r = await run(['generate', '--params', missing]);
    expect(r.code).toBe(2);
    expect(r.stderr).toBe(`lapwright generate: cannot read --params file ${missing}: ENOENT: no such file or directory, open '${missing}'\n`);
  });

  it('a --params file that is not JSON', async () => {
    const path = await file('broken.json', '{"lengthM": 1500,');
    const r = await run(['generate', '--params', path]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(new RegExp(`^lapwright generate: --params file ${path} is not valid JSON: .+\\n$`));
  });

  it('a --params file that is JSON but not an object is refused at (root)', async () => {
    const path = await file('array.json', '[1500]');
    expect(await run(['generate', '--params', path])).toEqual({
      code: 2,
      stdout: '',
      stderr: 'lapwright generate: invalid parameters (ERR_INVALID_PARAMS)\n  (root): expected an object of track parameters, got an array of 1 item\n',
    });
  });

  it('params from stdin (-) are checked like a file', async () => {
    const r = await run(['generate', '--params', '-'], '{"car": {"widthM": 9}}');
    expect(r).toEqual({ code: 2, stdout: '', stderr: 'lapwright generate: invalid parameters (ERR_INVALID_PARAMS)\n  car.widthM: expected a number from 0.5 to 5 m, got 9\n' });
  });

  it('an unwritable --out file', async () => {
    const out = join(dir, 'no-such-folder', 'track.json');
    const r = await run(['generate', '--seed', '7', '--out', out]);
    expect(r.code).toBe(2);
    expect(r.stderr).toBe(`lapwright generate: cannot write --out file ${out}: ENOENT: no such file or directory, open '${out}'\n`);
  });

  it('a track file that is not JSON, and one that is malformed, name the file or each field', async () => {
    const notJson = await file('not-json.json', 'lapwright');
    expect((await run(['validate', notJson])).stderr).toMatch(new RegExp(`^lapwright validate: track file ${notJson} is not valid JSON: `));
    const r = await run(['validate', '-'], JSON.stringify({ format: 'lapwright.track/1', id: 'x' }));
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.split('\n').slice(0, 4)).toEqual([
      'lapwright validate: malformed track (ERR_INVALID_TRACK)',
      '  seed: expected an integer from 0 to 4294967295 or a string of 1 to 64 characters, got nothing',
      '  generatorVersion: expected a string, got nothing',
      '  params: expected an object of resolved track parameters, got nothing',
    ]);
  });
});

describe('generate', () => {
  it('prints exactly JSON.stringify(track) and a newline', async () => {
    const r = await run(['generate', '--seed', '7']);
    expect(r).toEqual({ code: 0, stdout: JSON.stringify(generateTrack({ seed: 7 })) + '\n', stderr: '' });
  });

  it('--pretty indents by two spaces', async () => {
    const r = await run(['generate', '--seed', '7', '--pretty']);
    expect(r.stdout).toBe(JSON.stringify(generateTrack({ seed: 7 }), null, 2) + '\n');
  });

  it('--out writes the same bytes to the file and nothing to stdout', async () => {
    const out = join(dir, 'track-7.json');
    expect(await run(['generate', '--seed', '7', '--out', out])).toEqual({ code: 0, stdout: '', stderr: '' });
    expect(await readFile(out, 'utf8')).toBe(JSON.stringify(generateTrack({ seed: 7 })) + '\n');
  });

  it('--out - is stdout', async () => {
    expect((await run(['generate', '--seed', '7', '--out', '-'])).stdout).toBe(JSON.stringify(generateTrack({ seed: 7 })) + '\n');
  });

  it('a seed left out is drawn in 0..SEED_MAX and echoed in the track', async () => {
    const track = JSON.parse((await run(['generate', '--set', 'lengthM=600'])).stdout) as Track;
    expect(Number.isInteger(track.seed)).toBe(true);
    expect(track.seed).toBeGreaterThanOrEqual(0);
    expect(track.seed).toBeLessThanOrEqual(SEED_MAX);
    expect(track.params.seed).toBe(track.seed);
  });

  it('--seed: digits beyond SEED_MAX and other text are string seeds', async () => {
    for (const [flag, seed] of [[String(SEED_MAX + 1), String(SEED_MAX + 1)], ['lap-7', 'lap-7']]) {
      const track = JSON.parse((await run(['generate', '--seed', flag, '--set', 'lengthM=600'])).stdout) as Track;
      expect(track.seed).toBe(seed);
    }
  });

  it('--set merges over --params (dotted keys), and --seed wins over both', async () => {
    const path = await file('params.json', JSON.stringify({ seed: 1, lengthM: 900, widthM: { min: 9 } }));
    const r = await run(['generate', '--params', path, '--set', 'widthM.max=12', '--set', 'lengthM=800', '--set', 'seed=2', '--seed', '3']);
    expect(r.code).toBe(0);
    const track = JSON.parse(r.stdout) as Track;
    expect([track.seed, track.params.lengthM, track.params.widthM]).toEqual([3, 800, { min: 9, max: 12 }]);
    expect(r.stdout).toBe(JSON.stringify(generateTrack({ seed: 3, lengthM: 800, widthM: { min: 9, max: 12 } })) + '\n');
  });

  it('params can come from stdin', async () => {
    const r = await run(['generate', '--params', '-'], JSON.stringify({ seed: 'stdin', lengthM: 600 }));
    expect(r.code).toBe(0);
    expect((JSON.parse(r.stdout) as Track).seed).toBe('stdin');
  });
});

describe('exit 3: infeasible request', () => {
  it('all corners one way with a 900 degree budget: reason, message and hint on stderr', async () => {
    const r = await run(['generate', '--seed', '7', '--set', 'turnBalance=0', '--set', 'curvatureBudgetDeg=900']);
    expect(r).toEqual({
      code: 3,
      stdout: '',
      stderr: [
        'lapwright generate: infeasible request (ERR_INFEASIBLE, reason turning_vs_balance)',
        'every one of the 9 corners turns left (turnBalance 0), so a closed loop turns exactly 360 degrees, not 900',
        'hint: set curvatureBudgetDeg to 360, or set turnBalance so that round(turnBalance * 9) is between 1 and 8 (e.g. 0.12)',
        '',
      ].join('\n'),
    });
  });

  it('a radius too small for the road names both numbers', async () => {
    const r = await run(['generate', '--seed', '7', '--set', 'minCornerRadiusM=5', '--set', 'widthM.max=14']);
    expect(r.code).toBe(3);
    expect(r.stderr.split('\n')[0]).toBe('lapwright generate: infeasible request (ERR_INFEASIBLE, reason radius_vs_width)');
    expect(r.stderr.split('\n')[2]).toMatch(/^hint: raise minCornerRadiusM above 7.5 m/);
  });
});

describe('validate', () => {
  let trackPath: string;
  let track: Track;
  beforeAll(async () => {
    track = generateTrack({ seed: 11 });
    trackPath = await file('track-11.json', JSON.stringify(track));
  });

  it('a generated track is valid: {valid: true, issues: []} and exit 0', async () => {
    expect(await run(['validate', trackPath])).toEqual({ code: 0, stdout: '{"valid":true,"issues":[]}\n', stderr: '' });
  });

  it('reads the track from stdin with -', async () => {
    expect(await run(['validate', '-'], JSON.stringify(track))).toEqual({ code: 0, stdout: '{"valid":true,"issues":[]}\n', stderr: '' });
  });

  it('a well-formed track that breaks a guarantee exits 4 with the issues on stdout', async () => {
    // the lap is ~1500 m; claiming 3000 m breaks the length guarantee (±3%) without touching geometry
    const tampered = { ...track, params: { ...track.params, lengthM: 2 * track.params.lengthM } };
    const r = await run(['validate', await file('tampered.json', JSON.stringify(tampered))]);
    expect(r.code).toBe(4);
    expect(r.stderr).toBe('');
    const result = JSON.parse(r.stdout) as { valid: boolean; issues: { code: string; message: string }[] };
    expect(result.valid).toBe(false);
    expect(result.issues.length).toBeGreaterThan(0);
    expect(result.issues.every((i) => typeof i.code === 'string' && typeof i.message === 'string')).toBe(true);
  });

  it('--pretty indents the result', async () => {
    expect((await run(['validate', '--pretty', trackPath])).stdout).toBe('{\n  "valid": true,\n  "issues": []\n}\n');
  });
});

describe('exit 1: unexpected errors', () => {
  it('a failing stdout gives one line on stderr and no stack trace', async () => {
    const stdout = capture(new Error('disk full'));
    const stderr = capture();
    const code = await runCli(['--version'], { stdout, stderr, stdin: Readable.from([]) });
    expect(code).toBe(1);
    expect(stderr.text).toBe('lapwright: unexpected error: disk full\n');
  });

  it('a reader that went away (EPIPE) is not an error', async () => {
    const epipe = Object.assign(new Error('write EPIPE'), { code: 'EPIPE' });
    const code = await runCli(['--version'], { stdout: capture(epipe), stderr: capture(), stdin: Readable.from([]) });
    expect(code).toBe(0);
  });
});
