/**
 * The package version, read from the package.json above this file (src/ in the repository,
 * dist/src/ when built), so the CLI and the server report the version they ship with.
 */
import { readFile } from 'node:fs/promises';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

/** Name in package.json that marks lapwright's own manifest (not a dependency's). */
const PACKAGE_NAME = 'lapwright';

/**
 * Finds lapwright's package.json by walking up from this module and returns its version.
 * @returns the version string, or 'unknown' when no manifest is found
 * @example await readPackageVersion() // '0.1.0'
 */
export async function readPackageVersion(): Promise<string> {
  let dir = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    try {
      const pkg = JSON.parse(await readFile(join(dir, 'package.json'), 'utf8')) as { name?: unknown; version?: unknown };
      if (pkg.name === PACKAGE_NAME && typeof pkg.version === 'string') return pkg.version;
    } catch {
      // no package.json here: look one folder up
    }
    const up = dirname(dir);
    if (up === dir) return 'unknown';
    dir = up;
  }
}
