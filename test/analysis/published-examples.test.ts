/**
 * The analysis of a design file against published worked examples: Chow's uniform-flow and critical-depth
 * examples on the same trapezoidal channel, written as a Runnel design.
 */
import { describe, expect, it } from 'vitest';
import { FOOT_M, analyse, expectClose, flowOf, reachOf } from './analysis-test-kit.js';

// Chow (1959) Open-Channel Hydraulics: trapezoid b = 20 ft, z = 2 (H:V), n = 0.025, S = 0.0016, Q = 400 cfs.
const CHOW_CHANNEL = `
design "Chow (1959) uniform-flow example channel"
units US
flows { q = 400 cfs }
section chow trapezoid { bottom width 20 ft  side slopes 2:1  bank height 6 ft }
lining earth { n 0.025 }
channel example {
  reach r { section chow  lining earth  slope 0.0016 ft/ft  length 1000 ft }
  outlet normal depth
}`;

describe('Chow (1959) worked examples written as a design file', () => {
  it('N1: normal depth 3.36 ft (Chow 1959, Ch. 6 uniform-flow example, Example 6-2 as recalled; from memory, recomputes exactly)', async () => {
    const flow = flowOf(reachOf(await analyse(CHOW_CHANNEL), 'example', 'r'), 'q');
    // The book used k = 1.49; Runnel's exact k = 1.4859 gives 3.361 ft (REFERENCES.md, N1). Tolerance: half the
    // last printed digit of 3.36 plus the k shift (+0.15 %, about 0.005 ft).
    expectClose((flow.normal?.depth_m ?? Number.NaN) / FOOT_M, 3.361, 0.006, 'normal depth, ft');
    // Velocity is Q / A at that depth with A = (b + z y) y (closed form, derived).
    const depthFt = (flow.normal?.depth_m ?? Number.NaN) / FOOT_M;
    expectClose((flow.normal?.velocity_mps ?? Number.NaN) / FOOT_M, 400 / ((20 + 2 * depthFt) * depthFt), 1e-9, 'velocity, ft/s');
  });

  it('C1: critical depth 2.15 ft (Chow 1959, Ch. 4 critical-depth example, Example 4-2 as recalled; from memory, recomputes to 2.148)', async () => {
    const flow = flowOf(reachOf(await analyse(CHOW_CHANNEL), 'example', 'r'), 'q');
    // Chow used g = 32.2 ft/s2, Runnel 9.80665 m/s2 (32.174 ft/s2): yc ~ g^(-1/3) moves 0.03 %. Tolerance covers
    // the printed rounding (0.005 ft) and that shift.
    expectClose((flow.critical?.depth_m ?? Number.NaN) / FOOT_M, 2.15, 0.006, 'critical depth, ft');
  });

  it('N1 is subcritical on a mild slope: normal depth above critical depth (Chow 1959 Sec. 9-2; derived from N1 and C1)', async () => {
    const flow = flowOf(reachOf(await analyse(CHOW_CHANNEL), 'example', 'r'), 'q');
    expect([flow.regime, flow.slopeClass]).toEqual(['subcritical', 'mild']);
  });
});
