/**
 * Every sample, broken the way editing breaks files (tokens deleted, duplicated and swapped, the text cut off
 * anywhere, random bytes and unicode inserted, numbers replaced by 0, -1, 1e-300, 1e300, 1e309 and the like, very
 * long names and lines), goes through parse, validation, analysis, both reports, inlay hints, hover and formatting
 * (document-harness.ts says what each must do), in a worker thread stopped after a bound (bounded-harness.ts).
 * Failures print the fast-check seed and the shrunk mutations.
 */
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sampleFiles } from '../language/language-test-kit.js';
import { BoundedHarness } from './bounded-harness.js';
import { fuzzParameters, reportSetAside } from './fuzz-settings.js';
import { setAsideKnownDefects } from './known-defects.js';
import { applyMutations, clip, mutations } from './text-mutations.js';

const samples = sampleFiles();
const names = Object.keys(samples).sort();
let harness: BoundedHarness;
const setAside = new Map<string, number>();

async function expectClean(name: string, text: string, options: { format?: boolean; hoverPositions?: number } = {}): Promise<void> {
  const outcome = await harness.check(name, text, options);
  await harness.restore(name);
  const { unknown, known } = setAsideKnownDefects(outcome.problems);
  for (const [id, count] of known) setAside.set(id, (setAside.get(id) ?? 0) + count);
  expect(unknown, `${name} as mutated:\n${clip(text)}`).toEqual([]);
}

describe('mutated samples', () => {
  beforeAll(async () => {
    harness = await BoundedHarness.create(samples);
    if (harness.editorFeaturesNote) console.warn(harness.editorFeaturesNote);
  }, 90_000);
  afterAll(async () => {
    reportSetAside('mutated samples', setAside);
    await harness?.close();
  });

  it('has samples, and each passes untouched', async () => {
    expect(names.length).toBeGreaterThanOrEqual(4);
    for (const name of names) await expectClean(name, samples[name] ?? '');
  });

  it('survives random mutations of every sample', { timeout: 120_000 }, async () => {
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...names), mutations, async (name, list) => {
        await expectClean(name, applyMutations(samples[name] ?? '', list));
      }),
      fuzzParameters(75),
    );
  });

  it('survives every sample cut off at evenly spread places (mid-token, mid-string, mid-block)', { timeout: 120_000 }, async () => {
    for (const name of names) {
      const text = samples[name] ?? '';
      for (let cut = 1; cut < 12; cut++) await expectClean(name, text.slice(0, Math.floor((text.length * cut) / 12) + (cut % 3)), { hoverPositions: 12 });
    }
  });
});
