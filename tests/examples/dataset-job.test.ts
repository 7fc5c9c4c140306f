// examples/k8s/dataset-job.yaml: the Indexed Job runs one shard per completion index, with ranges the batch schema accepts.

import { readFile } from 'node:fs/promises';
import { describe, expect, it } from 'vitest';
import { parseAllDocuments } from 'yaml';
import { parseShard } from '../../src/cli/batch.js';
import { paramRangesSchema } from '../../src/schema/batch.js';

const FILE = new URL('../../examples/k8s/dataset-job.yaml', import.meta.url);

describe('examples/k8s/dataset-job.yaml', () => {
  it('an Indexed Job whose pods make shard JOB_COMPLETION_INDEX of as many shards as completions, of one dataset', async () => {
    // eslint-disable-next-line @typescript-eslint/no-explicit-any
    const [job, config] = parseAllDocuments(await readFile(FILE, 'utf8')).map((d) => d.toJS() as Record<string, any>);
    expect([job.apiVersion, job.kind, job.spec.completionMode]).toEqual(['batch/v1', 'Job', 'Indexed']);
    const container = job.spec.template.spec.containers[0];
    const line: string = container.args[0];
    const shard = /--shard "\$\{JOB_COMPLETION_INDEX\}\/(\d+)"/.exec(line);
    expect(Number(shard?.[1])).toBe(job.spec.completions);
    for (let k = 0; k < job.spec.completions; k++) expect(parseShard(`${k}/${shard?.[1]}`)).toEqual({ index: k, count: job.spec.completions });
    expect(line).toMatch(/^exec node bin\/lapwright\.js batch --count \d+ --split train --base-seed \S+ --params \/config\/train-ranges\.json/);
    expect(job.spec.template.spec.restartPolicy).toBe('Never');
    expect(container.volumeMounts.map((m: { mountPath: string }) => m.mountPath)).toEqual(['/data', '/config']);
    expect(config.kind).toBe('ConfigMap');
    expect(paramRangesSchema.safeParse(JSON.parse(config.data['train-ranges.json'])).success).toBe(true);
  });
});
