import fc from 'fast-check';
import { it } from 'vitest';
import { sampleFiles } from '../language/language-test-kit.js';
import { DocumentHarness } from './document-harness.js';
import { applyMutations, clip, mutations } from './text-mutations.js';

it('explore', async () => {
  const samples = sampleFiles();
  const t0 = performance.now();
  const harness = await DocumentHarness.create(samples);
  console.log('create', performance.now() - t0, harness.hasEditorFeatures);
  for (const [name, text] of Object.entries(samples)) {
    const o = await harness.check(name, text);
    console.log(name, o.elapsedMs.toFixed(0), o.problems);
  }
  const names = Object.keys(samples);
  const seen = new Map<string, number>();
  let runs = 0;
  const t1 = performance.now();
  fc.assert(fc.property(fc.constant(0), () => true));
  await fc.assert(fc.asyncProperty(fc.constantFrom(...names), mutations, async (name, list) => {
    const text = applyMutations(samples[name]!, list);
    const o = await harness.check(name, text);
    await harness.restore(name);
    runs++;
    for (const p of o.problems) {
      const key = p.slice(0, 90);
      if (!seen.has(key)) { seen.set(key, 1); console.log('PROBLEM', name, JSON.stringify(list).slice(0, 400), '\n', p.slice(0, 1500)); }
    }
    return true;
  }), { numRuns: Number(process.env.RUNS ?? 200), seed: Number(process.env.SEED ?? 1) });
  console.log('runs', runs, 'ms per run', ((performance.now() - t1) / runs).toFixed(1));
}, 600_000);
