/**
 * The defects that the fuzz suites set aside (known-defects.ts), each still reproducing. A failure
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

  it('sets aside only the problems of a known defect (none while none is open)', () => {
    const problems = ['took 5200 ms to check (bound 4000 ms)', "HTML report shows 'Infinity': <path d=\"M0 0 LInfinity 1\"/>", 'threw: TypeError: x is undefined'];
    const { unknown, known } = setAsideKnownDefects(problems);
    expect([...known.keys()]).toEqual(KNOWN_DEFECTS.filter((defect) => problems.some((problem) => defect.matches(problem))).map((defect) => defect.id));
    expect(unknown.length + [...known.values()].reduce((sum, count) => sum + count, 0)).toBe(problems.length);
  });
});
