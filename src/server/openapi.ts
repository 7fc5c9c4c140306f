/**
 * The OpenAPI document, generated from the zod schemas of the routes (GET /openapi.json serves
 * the same). `npm run openapi` writes it to openapi/openapi.json; a test fails when that file
 * is stale.
 */
import { buildApp } from './app.js';

/** Where `npm run openapi` writes the document, relative to the repository root. */
export const OPENAPI_FILE = 'openapi/openapi.json';

/**
 * Builds the document from an app that runs no workers.
 * @example const doc = await buildOpenApiDocument(); doc.openapi // '3.1.0'
 */
export async function buildOpenApiDocument(): Promise<Record<string, unknown>> {
  const app = await buildApp({ startPool: false });
  try {
    await app.ready();
    return app.swagger() as unknown as Record<string, unknown>;
  } finally {
    await app.close();
  }
}

/** The document as the checked-in file holds it: 2-space indented JSON and a final newline. */
export function renderOpenApi(document: unknown): string {
  return `${JSON.stringify(document, null, 2)}\n`;
}
