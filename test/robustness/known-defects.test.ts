/**
 * The defects in others' code that the fuzz suites set aside (known-defects.ts), each still reproducing. A failure
 * here is good news: the defect is fixed, so delete its entry from known-defects.ts and the fuzzing covers it again.
 */
import { describe, expect, it } from 'vitest';
import { KNOWN_DEFECTS, setAsideKnownDefects } from './known-defects.js';

describe('known defects set aside by the fuzz suites', () => {
  for (const defect of KNOWN_DEFECTS) {
    it(`${defect.id} (${defect.owner}) still reproduces; when this fails, delete its entry from known-defects.ts`, async () => {
      expect(await defect.present(), defect.summary).toBe(true);
    });
  }

  it('sets aside only the problems of a known defect', () => {
    const { unknown, known } = setAsideKnownDefects([
      'took 5200 ms to check (bound 4000 ms)',
      "diagnostic manning-n-unusual shows 'Infinity': …Manning's n Infinity is outside the usual range…",
      'threw: TypeError: x is undefined',
    ]);
    expect([...known.keys()]).toEqual(['analysis-profile-work-unbounded']);
    expect(unknown).toHaveLength(2);
  });
});
