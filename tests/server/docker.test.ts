/**
 * The Dockerfile works: its build and start steps, replayed in a clean copy of the repository
 * (tests/server/docker-replay.ts; `npm run docker:check` runs the same with progress on stdout).
 * Takes about 20 s (npm ci from the local cache, a build, a prune, a start and a stop).
 */
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { GENERATOR_VERSION } from '../../src/core/index.js';
import { readPackageVersion } from '../../src/version.js';
import { parseDockerfile, replayDockerfile } from './docker-replay.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));

describe('Dockerfile', () => {
  it('parses instructions with continuation lines, without comments', () => {
    expect(parseDockerfile('# c\nFROM node:20-slim AS build\n\nRUN a \\\n  && b\nCMD ["x"]\n')).toEqual([
      { op: 'FROM', args: 'node:20-slim AS build', line: 2 },
      { op: 'RUN', args: 'a    && b', line: 4 },
      { op: 'CMD', args: '["x"]', line: 6 },
    ]);
  });

  it('replayed in a clean copy: npm ci, build, prune, then the image starts as a non-root user, passes its HEALTHCHECK, serves the preview page and stops on SIGTERM with 0', { timeout: 300_000 }, async () => {
    const lines: string[] = [];
    const report = await replayDockerfile({ contextDir: ROOT, log: (line) => lines.push(line) });
    expect(report, lines.join('\n')).toEqual({
      stages: ['build', 'runtime'],
      steps: expect.any(Number),
      user: 'node',
      exposed: ['8080'],
      healthz: { status: 'ok', version: await readPackageVersion(), generatorVersion: GENERATOR_VERSION },
      exitCode: 0,
    });
    expect(lines).toContain('RUN npm ci --ignore-scripts --no-audit --no-fund');
    expect(lines).toContain('RUN npm prune --omit=dev --no-audit --no-fund');
    expect(lines).toContain('HEALTHCHECK passed');
    expect(lines).toContain('GET / and its assets (/assets/style.css, /assets/app.js): 200');
  });
});
