import { describe, expect, it } from 'vitest';
import { GENERATOR_VERSION } from '../../../src/core/index.js';
import { type BatchRequest, makeManifest, type Manifest, type ManifestTrack, MANIFEST_FORMAT, mergeShards, referenceSummary } from '../../../src/core/batch/manifest.js';

const REQUEST: BatchRequest = { count: 5, split: 'train', baseSeed: 'larkspur', params: { lengthM: 900 }, difficulty: null, minNovelty: 0, reference: null };

// a stand-in entry: the merge reads only index (and keeps the rest as it is)
function entry(index: number): ManifestTrack {
  return { index, seed: 1000 + index, draw: 0, split: 'train', id: `id-${index}`, params: {} as ManifestTrack['params'], metrics: {} as ManifestTrack['metrics'], shape: 'x', file: `track-${index}.json` };
}

function shard(i: number, n: number): Manifest {
  const tracks = [0, 1, 2, 3, 4].filter((k) => k % n === i).map(entry);
  return makeManifest({ request: REQUEST, output: { format: 'json' }, shard: { index: i, count: n }, tracks, redrawn: i, skipped: { split: 10 * i, difficulty: 0, novelty: 0 } });
}

describe('manifests', () => {
  it('keep one key order: format, generatorVersion, request, split, output, shard, tracks, redrawn, skipped', () => {
    const m = shard(0, 1);
    expect(Object.keys(m)).toEqual(['format', 'generatorVersion', 'request', 'split', 'output', 'shard', 'tracks', 'redrawn', 'skipped']);
    expect(m.format).toBe(MANIFEST_FORMAT);
    expect(m.generatorVersion).toBe(GENERATOR_VERSION);
  });

  it('merging the shards of a batch gives the manifest of the whole batch, byte for byte', () => {
    const whole = makeManifest({ request: REQUEST, output: { format: 'json' }, shard: null, tracks: [0, 1, 2, 3, 4].map(entry), redrawn: 0 + 1 + 2, skipped: { split: 0 + 10 + 20, difficulty: 0, novelty: 0 } });
    expect(JSON.stringify(mergeShards([shard(2, 3), shard(0, 3), shard(1, 3)]))).toBe(JSON.stringify(whole));
  });

  it('refuses shards that are not the n parts of one batch', () => {
    expect(() => mergeShards([shard(0, 3), shard(1, 3)])).toThrow('missing shard 2/3');
    expect(() => mergeShards([shard(0, 2), shard(0, 2), shard(1, 2)])).toThrow('shard 0/2 is given twice');
    expect(() => mergeShards([shard(0, 2), shard(1, 3)])).toThrow('shards of 2 and of 3');
    expect(() => mergeShards([shard(0, 2), { ...shard(1, 2), request: { ...REQUEST, count: 6 } }])).toThrow('different request');
    expect(() => mergeShards([])).toThrow('no shard manifests');
  });

  it('summarise a reference by count and the sha256 of its shapes joined by newlines', () => {
    // sha256 of the three bytes "a\nb" (printf 'a\nb' | sha256sum)
    expect(referenceSummary(['a', 'b'])).toEqual({ tracks: 2, digest: '7e18f737311b2dc3b2f269dd78396b0351f14fb66efa879f768cb23181883c78' });
  });
});
