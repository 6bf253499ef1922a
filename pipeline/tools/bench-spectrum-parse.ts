/**
 * Benchmark of `parseSpectrumCsv`: builds one in-memory spectrum file of 4,096 channels ×
 * 16 detectors (counts drawn from a seeded generator: a falling background with a few
 * peaks, so the file is about the size of a real one, ≈ 180 kB), parses it repeatedly on
 * one core (after a warm-up) and prints the median throughput of several rounds.
 *
 *   npx tsx pipeline/tools/bench-spectrum-parse.ts [repetitions=200] [rounds=10]
 */
import { cpus } from 'node:os';
import { parseSpectrumCsv } from '../core/formats/spectrum-csv.js';
import { Xoshiro128StarStar } from '../core/random/xoshiro128-star-star.js';

/** The project's seeded generator (the simulator's), as a function returning uniforms in [0, 1). */
const uniform = (seed: number): (() => number) => {
  const g = Xoshiro128StarStar.fromSeed(seed);
  return () => g.nextFloat64();
};

const CHANNELS = 4096;
const DETECTORS = 16;


function benchSpectrumText(seed: number): string {
  const random = uniform(seed);
  const gauss = (): number => Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
  const ids = Array.from({ length: DETECTORS }, (_, k) => `d${String(k + 1).padStart(2, '0')}`);
  const lines = [`channel,${ids.join(',')}`];
  const peaks = [900, 1700, 2300, 3100, 3650];
  for (let ch = 0; ch < CHANNELS; ch++) {
    const row: number[] = [ch];
    for (let k = 0; k < DETECTORS; k++) {
      let mean = 3 * Math.exp(-ch / 700) + 0.4;
      for (const p of peaks) mean += 900 * Math.exp(-0.5 * ((ch - p - 10 * k) / 6) ** 2);
      row.push(Math.max(0, Math.round(mean + Math.sqrt(mean) * gauss())));
    }
    lines.push(row.join(','));
  }
  return `${lines.join('\n')}\n`;
}

/** Parses `bytes` `repetitions` times; returns seconds taken and a checksum (so no work is optimized away). */
function timeParses(bytes: Uint8Array, repetitions: number): { seconds: number; checksum: number } {
  let checksum = 0;
  const t0 = process.hrtime.bigint();
  for (let i = 0; i < repetitions; i++) {
    const { spectrum } = parseSpectrumCsv(bytes, 'bench.csv');
    if (spectrum === null) throw new Error('benchmark spectrum failed to parse');
    checksum += spectrum.counts[i % DETECTORS][i % CHANNELS];
  }
  return { seconds: Number(process.hrtime.bigint() - t0) / 1e9, checksum };
}

function main(): void {
  const repetitions = Number(process.argv[2] ?? 200);
  const rounds = Number(process.argv[3] ?? 10);
  const bytes = new TextEncoder().encode(benchSpectrumText(20260301));
  let checksum = timeParses(bytes, 100).checksum; // warm-up: let the optimizing compiler settle
  const rates: number[] = [];
  for (let r = 0; r < rounds; r++) {
    const t = timeParses(bytes, repetitions);
    checksum += t.checksum;
    rates.push((bytes.length * repetitions) / 1e6 / t.seconds);
  }
  rates.sort((a, b) => a - b);
  const median = rates[Math.floor(rates.length / 2)];
  const perFileMs = (bytes.length / 1e6 / median) * 1e3;
  console.log(`spectrum parse: ${CHANNELS} channels x ${DETECTORS} detectors, ${(bytes.length / 1e3).toFixed(1)} kB per file`);
  console.log(`  ${median.toFixed(0)} MB/s on one core (median of ${rounds} rounds of ${repetitions} parses; slowest ${rates[0].toFixed(0)}, fastest ${rates[rates.length - 1].toFixed(0)})`);
  console.log(`  ${perFileMs.toFixed(3)} ms per file; 1,000 such runs: ${perFileMs.toFixed(2)} s of parsing on one core`);
  console.log(`  machine: ${cpus()[0]?.model ?? 'unknown'} (${cpus().length} cores), Node ${process.version}; checksum ${checksum}`);
}

main();
