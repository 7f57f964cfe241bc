/**
 * Every fast-check property stops within PROPERTY_TIME_LIMIT_MS (times RUNNEL_FUZZ_SCALE for long local runs): a
 * failure found by then is reported with its seed, its path and the counterexample shrunk so far, and a property
 * still running then fails as interrupted (as vitest's timeout would have failed it). Without the limit a failure
 * of a synchronous property shrinks for minutes (a random 4-reach channel: over 100 s in one CI run), and vitest's
 * timeout, which cannot stop synchronous code, then reports only "timed out", without the seed to replay it.
 */
import fc from 'fast-check';
import { FUZZ_SCALE } from '../robustness/fuzz-settings.js';

/** Under vitest's 30 s test timeout (vitest.config.ts), so that fast-check's own report is the one shown. */
export const PROPERTY_TIME_LIMIT_MS = 25_000;

fc.configureGlobal({ interruptAfterTimeLimit: PROPERTY_TIME_LIMIT_MS * FUZZ_SCALE, markInterruptAsFailure: true });
