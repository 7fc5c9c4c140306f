// The generator's benchmark: npm run bench. Seeded requests, warm-up first, then min, median and
// mean ± std per track (times are wall-clock on this machine, one core); mean attempts and the
// success rate of realistic profiles; generation time over JSON.stringify time of the same
// track; the drivability checks' cost per track (speed profile, reference drive, sensor check),
// absolute and as a share of generation time; and variety, the median pairwise turning-function
// distance (Arkin et al. 1991) of 50 tracks drawn for the median real permanent circuit (4.6 km,
// 1570°, 15 corners, 40% minority).

import { spawnSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import { buildRoadStrip } from '../../src/core/drive/road-strip.js';
import { referenceDrive } from '../../src/core/drive/reference-drive.js';
import { sensorCoverage } from '../../src/core/drive/sensors.js';
import { speedProfile, STANDARD_GRAVITY_MPS2 } from '../../src/core/drive/speed-profile.js';
import { generateTrack, MAX_ATTEMPTS } from '../../src/core/generate.js';
import { isInfeasibleError } from '../../src/core/errors.js';
import { turningDistanceBetween, turningSignature } from '../../src/core/metrics/turning-distance.js';
import type { TrackRequest } from '../../src/core/params/types.js';
import type { Track } from '../../src/core/track.js';
import { validateTrack } from '../../src/core/validate/index.js';

const loadAtStart = loadavg()[0];
const quick = process.argv.includes('--quick');
// the dataset figures (tests/bench/batch.ts: lapwright batch with 1 and 2 workers, streamed HTTP
// batch) follow unless --quick or --no-batch
const withBatch = !quick && !process.argv.includes('--no-batch');
// --write FILE: also write the figures as a Markdown page (docs/benchmarks.md)
const writeTo = process.argv.includes('--write') ? process.argv[process.argv.indexOf('--write') + 1] : undefined;

interface Stats {
  min: number;
  median: number;
  mean: number;
  std: number;
}

function stats(xs: number[]): Stats {
  const s = [...xs].sort((a, b) => a - b);
  const mean = s.reduce((a, b) => a + b, 0) / s.length;
  const std = Math.sqrt(s.reduce((a, b) => a + (b - mean) ** 2, 0) / s.length);
  return { min: s[0], median: s[s.length >> 1], mean, std };
}

function fmt(s: Stats): string {
  return `median ${s.median.toFixed(2)} ms, min ${s.min.toFixed(2)}, mean ${s.mean.toFixed(2)} ± ${s.std.toFixed(2)}`;
}

function timeTracks(base: Omit<TrackRequest, 'seed'>, seeds: number, warmup: number): { gen: Stats; json: Stats; validate: Stats; attempts: number; tracks: Track[] } {
  // warm-up: a long-running service runs optimized code; the first tracks of a process also pay
  // for compiling it
  for (let k = 0; k < warmup; k++) generateTrack({ ...base, seed: 1_000_000 + k });
  const gen: number[] = [], json: number[] = [], check: number[] = [];
  let attempts = 0;
  for (let seed = 0; seed < seeds; seed++) {
    let t0 = performance.now();
    const t = generateTrack({ ...base, seed });
    gen.push(performance.now() - t0);
    t0 = performance.now();
    const text = JSON.stringify(t);
    json.push(performance.now() - t0);
    t0 = performance.now();
    validateTrack(t);
    check.push(performance.now() - t0);
    if (text.length === 0) throw new Error('empty JSON');
    attempts += t.attempts;
  }
  // tracks are not kept while timing (a service lets each go once sent; keeping them all would
  // add the cost of promoting them to the old generation); the drivability timing makes some again
  const tracks: Track[] = [];
  for (let seed = 0; seed < Math.min(seeds, 20); seed++) tracks.push(generateTrack({ ...base, seed }));
  return { gen: stats(gen), json: stats(json), validate: stats(check), attempts: attempts / seeds, tracks };
}

// the drivability checks of each track again, timed apart: what the generator spends on them
// once per built layout (the checker's rejects aside)
function timeDrivability(tracks: Track[], rounds: number): { profile: Stats; drive: Stats; sensors: Stats } {
  const profile: number[] = [], drive: number[] = [], sensors: number[] = [];
  for (let round = 0; round < rounds; round++) {
    for (const t of tracks) {
      const v = t.params.vehicle, c = t.centerline;
      let t0 = performance.now();
      const strip = buildRoadStrip(t);
      const p = speedProfile(c.curvature, c.spacingM, v);
      profile.push(performance.now() - t0);
      const grip = v.mu * STANDARD_GRAVITY_MPS2;
      t0 = performance.now();
      const d = referenceDrive(strip, p.speedMps, (c.headingDeg[0] * Math.PI) / 180, { wheelbaseM: v.wheelbaseM, widthM: v.widthM, lengthM: v.lengthM, maxSteerRad: (v.maxSteerDeg * Math.PI) / 180, accelMps2: Math.min(v.maxAccelMps2, grip), brakeMps2: Math.min(v.maxBrakeMps2, grip) }, p.lapTimeS);
      drive.push(performance.now() - t0);
      t0 = performance.now();
      const cov = sensorCoverage(strip, Float64Array.from(c.headingDeg, (h) => (h * Math.PI) / 180), t.gates, t.params.sensors);
      sensors.push(performance.now() - t0);
      if (!d.completed || !(cov.poses > 0)) throw new Error('a shipped track failed its drive');
    }
  }
  return { profile: stats(profile), drive: stats(drive), sensors: stats(sensors) };
}

function sayDrivability(name: string, gen: Stats, tracks: Track[]): void {
  const d = timeDrivability(tracks, 3);
  const share = (s: Stats) => `${((100 * s.median) / gen.median).toFixed(0)}%`;
  const total = d.profile.median + d.drive.median + d.sensors.median;
  // minima are the figures least moved by other work on the machine
  const totalMin = d.profile.min + d.drive.min + d.sensors.min;
  say(`  ${name} drivability checks per track (share of the generation median, which includes them): reference drive ${fmt(d.drive)} (${share(d.drive)}); sensors ${d.sensors.median.toFixed(2)} ms (${share(d.sensors)}); speed profile and strip ${d.profile.median.toFixed(2)} ms (${share(d.profile)}); together ${total.toFixed(2)} ms, ${((100 * total) / gen.median).toFixed(0)}% of generation (minima: ${totalMin.toFixed(2)} of ${gen.min.toFixed(2)} ms, ${((100 * totalMin) / gen.min).toFixed(0)}%)`);
}

const lines: string[] = [];
const say = (s: string) => {
  lines.push(s);
  console.log(s);
};

say(`lapwright generator benchmark, node ${process.version}, ${new Date().toISOString().slice(0, 10)}${quick ? ' (quick)' : ''}`);

const def = timeTracks({}, quick ? 20 : 200, 50);
say(`default request (1.5 km, 900°, 9 corners): ${fmt(def.gen)}; mean attempts ${def.attempts.toFixed(2)}`);
say(`  of which the checker alone: ${fmt(def.validate)}`);
say(`  JSON.stringify of the same track: ${fmt(def.json)}; ratio generate / stringify (medians) ${(def.gen.median / def.json.median).toFixed(1)}`);
sayDrivability('default:', def.gen, def.tracks);

const long = timeTracks({ lengthM: 8000, curvatureBudgetDeg: 3000, cornerCount: 30 }, quick ? 5 : 40, 10);
say(`8 km, 3000°, 30 corners: ${fmt(long.gen)}; mean attempts ${long.attempts.toFixed(2)}; ratio to stringify ${(long.gen.median / long.json.median).toFixed(1)}`);
sayDrivability('8 km:', long.gen, long.tracks);

// success and attempts of realistic profiles
const profiles: Record<string, Omit<TrackRequest, 'seed'>> = {
  'kart 600 m, 12 corners, 6-8 m wide': { lengthM: 600, curvatureBudgetDeg: 1200, cornerCount: 12, minCornerRadiusM: 8, widthM: { min: 6, max: 8 } },
  'circuit 4.6 km, 15 corners': { lengthM: 4600, curvatureBudgetDeg: 1570, cornerCount: 15, turnBalance: 0.4, widthM: { min: 8, max: 18 } },
  'twisty 10 km, 40 corners': { lengthM: 10000, curvatureBudgetDeg: 4000, cornerCount: 40, turnBalance: 0.45 },
  'narrow 1.2 km, 4-5 m': { lengthM: 1200, widthM: { min: 4, max: 5 }, minCornerRadiusM: 8 },
  'wide 3 km, 25-30 m': { lengthM: 3000, widthM: { min: 25, max: 30 }, minCornerRadiusM: 20, curvatureBudgetDeg: 1200 },
  'all-left 2 km, 3 corners': { lengthM: 2000, curvatureBudgetDeg: 360, turnBalance: 0, cornerCount: 3 },
  'all-right 2 km, 8 corners': { lengthM: 2000, curvatureBudgetDeg: 360, turnBalance: 1, cornerCount: 8 },
};
const perProfile = quick ? 10 : 100;
for (const [name, base] of Object.entries(profiles)) {
  let ok = 0, attempts = 0;
  const times: number[] = [];
  const made: Track[] = [];
  for (let seed = 0; seed < perProfile; seed++) {
    const t0 = performance.now();
    try {
      const t = generateTrack({ ...base, seed });
      attempts += t.attempts;
      if (made.length < 20) made.push(t);
      ok++;
    } catch (e) {
      if (!isInfeasibleError(e)) throw e;
      attempts += MAX_ATTEMPTS;
    }
    times.push(performance.now() - t0);
  }
  const gen = stats(times);
  say(`${name}: ${ok}/${perProfile} succeed, mean attempts ${(attempts / perProfile).toFixed(2)}, ${fmt(gen)}`);
  if (name.startsWith('kart') || name.startsWith('circuit')) sayDrivability(`${name.split(',')[0]}:`, gen, made);
}

// variety
const circuits: Track[] = [];
for (let seed = 0; seed < 50; seed++) circuits.push(generateTrack({ ...profiles['circuit 4.6 km, 15 corners'], seed }));
const sigs = circuits.map((t) => turningSignature(new Float64Array(t.centerline.points.flat()), 512));
const d: number[] = [];
for (let i = 0; i < sigs.length; i++) for (let j = i + 1; j < sigs.length; j++) d.push(turningDistanceBetween(sigs[i], sigs[j]));
d.sort((a, b) => a - b);
say(`variety, 50 circuits (4.6 km, 1570°, 15 corners, 0.4): median pairwise turning distance ${d[d.length >> 1].toFixed(3)} (p10 ${d[Math.floor(0.1 * d.length)].toFixed(3)}, p90 ${d[Math.floor(0.9 * d.length)].toFixed(3)}); real circuits 1.20, target >= 1.0`);

let batchLines: string[] = [];
if (withBatch) {
  console.log('dataset throughput (tests/bench/batch.ts):');
  const batch = spawnSync(process.execPath, ['--import', 'tsx', 'tests/bench/batch.ts'], { cwd: new URL('../../', import.meta.url), encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'] });
  batchLines = batch.stdout.trimEnd().split('\n').filter((l) => l.length > 0);
  for (const l of batchLines) console.log(l);
  if (batch.status !== 0) throw new Error(`tests/bench/batch.ts exited ${batch.status}`);
}

if (writeTo) {
  const cpu = cpus();
  const page = `# Generator benchmark

Written by \`npm run bench -- --write docs/benchmarks.md\` (tests/bench/run.ts). Wall-clock times on
one core of the machine below, after warm-up; compare figures only between runs on the same
machine. Load average when the run started: ${loadAtStart.toFixed(2)} (other work shared the machine).

Machine: ${cpu.length} × ${cpu[0]?.model ?? 'unknown CPU'}, Node ${process.version}.

\`\`\`
${lines.join('\n')}
\`\`\`
${batchLines.length > 0 ? `\nDataset throughput (tests/bench/batch.ts, run by \`npm run bench\` after the generator figures):\n\n\`\`\`\n${batchLines.join('\n')}\n\`\`\`\n` : ''}`;
  writeFileSync(writeTo, page);
}
