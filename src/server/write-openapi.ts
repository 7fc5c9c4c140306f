/**
 * `npm run openapi`: writes the OpenAPI document to openapi/openapi.json (or the path given).
 */
import { mkdir, writeFile } from 'node:fs/promises';
import { dirname, resolve } from 'node:path';
import { buildOpenApiDocument, OPENAPI_FILE, renderOpenApi } from './openapi.js';

const target = resolve(process.argv[2] ?? OPENAPI_FILE);
await mkdir(dirname(target), { recursive: true });
await writeFile(target, renderOpenApi(await buildOpenApiDocument()), 'utf8');
process.stdout.write(`wrote ${target}\n`);
