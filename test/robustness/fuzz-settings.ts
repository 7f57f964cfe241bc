/**
 * Shared settings of the fuzz suites. RUNNEL_FUZZ_SEED=<n> replays a run (fast-check prints the seed and the
 * shrunk case of every failure); RUNNEL_FUZZ_SCALE=<k> multiplies the number of cases (e.g. 10 for a long local
 * run). The defaults keep the whole robustness folder within about 40 s on a loaded two-core machine.
 */
import type { Parameters } from 'fast-check';

const seedText = process.env['RUNNEL_FUZZ_SEED'];
const scaleText = process.env['RUNNEL_FUZZ_SCALE'];
const scale = scaleText !== undefined && Number(scaleText) > 0 ? Number(scaleText) : 1;

/** fast-check parameters for `runs` cases (scaled), with the replay seed when one is given. */
export function fuzzParameters<T>(runs: number): Parameters<T> {
  const seed = seedText !== undefined && seedText !== '' ? Number(seedText) : undefined;
  return { numRuns: Math.max(1, Math.round(runs * scale)), ...(seed === undefined ? {} : { seed }) };
}

/** A seed for the suites that draw their own random numbers (printed with every failure). */
export function fuzzSeed(): number {
  return seedText !== undefined && seedText !== '' ? Number(seedText) : Math.floor(Math.random() * 2 ** 31);
}

export const FUZZ_SCALE = scale;

/** Counts of problems set aside as known defects, printed once per suite. */
export function reportSetAside(suite: string, counts: ReadonlyMap<string, number>): void {
  if (counts.size === 0) return;
  console.warn(`${suite}: set aside ${[...counts].map(([id, count]) => `${count} x ${id}`).join(', ')} (known defects, see test/robustness/known-defects.ts)`);
}
