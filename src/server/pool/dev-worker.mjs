// Development and tests only (the build runs the compiled .js worker directly): loads a
// TypeScript worker entry through tsx. Node 20 does not apply `--import tsx` hooks to a worker's
// own entry file, so the worker starts here and imports the .ts entry with tsx's scoped loader.
import { workerData } from 'node:worker_threads';
import { tsImport } from 'tsx/esm/api';

await tsImport(workerData.lapwrightEntry, import.meta.url);
