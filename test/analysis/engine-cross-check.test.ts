/**
 * The analysis of a sample design agrees with the engine called directly on the same inputs, converted to SI here
 * by hand: what the analysis adds (reading the file, units, flows, criteria) must not change the numbers.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import {
  boundaryShear,
  criticalSlope,
  fullFlowCapacityM3s,
  hydraulicStateAt,
  manningDischargeM3s,
  solveCriticalDepth,
  solveNormalDepth,
  trapezoidSection,
  circleSection,
} from '../../language/hydraulics/index.js';
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import { buildWorkspace } from '../language/language-test-kit.js';
import { CFS_M3S, FOOT_M, expectClose, flowOf, reachOf } from './analysis-test-kit.js';
import { NO_CRITERIA_DEFAULTS } from '../../language/analysis/criteria-settings.js';

const SAMPLES = join(import.meta.dirname, '..', '..', 'samples');
const read = (name: string): string => readFileSync(join(SAMPLES, name), 'utf8');

async function sampleAnalysis(name: string) {
  const { documents } = await buildWorkspace({ [name]: read(name), 'linings.runnel': read('linings.runnel') });
  return analyzeDocument(documents[0]!, NO_CRITERIA_DEFAULTS);
}

const RELATIVE = 1e-9;

describe('roadside-ditches.runnel, reach north-ditch/hillside, against the engine', () => {
  // Inputs as written in the sample and in linings.runnel (grass-medium), converted by hand:
  // flat-bottom trapezoid, bottom 2 ft, sides 3:1, bank 2 ft; n 0.035; inverts 512.40 ft to 497.40 ft over 600 ft.
  const section = trapezoidSection({ bottomWidthM: 2 * FOOT_M, leftSideSlopeHV: 3, rightSideSlopeHV: 3 });
  const manningN = 0.035;
  const bedSlope = (512.4 - 497.4) / 600;
  const bankM = 2 * FOOT_M;

  for (const [flowName, dischargeCfs] of [
    ['q10', 9],
    ['q25', 12],
  ] as const) {
    it(`${flowName} = ${dischargeCfs} cfs gives the engine's depths, state, shear and freeboard`, async () => {
      const reach = reachOf(await sampleAnalysis('roadside-ditches.runnel'), 'north-ditch', 'hillside');
      const flow = flowOf(reach, flowName);
      const dischargeM3s = dischargeCfs * CFS_M3S;
      expectClose(flow.discharge_m3s, dischargeM3s, RELATIVE * dischargeM3s, 'discharge');
      expectClose(reach.slope, bedSlope, 1e-15, 'slope from inverts');

      const normal = solveNormalDepth(section, { dischargeM3s, manningN, bedSlope });
      const critical = solveCriticalDepth(section, dischargeM3s);
      if (!normal.converged || !critical.converged) throw new Error('engine did not converge');
      const state = hydraulicStateAt(section, normal.depthM, dischargeM3s);
      expectClose(flow.normal?.depth_m, normal.depthM, RELATIVE * normal.depthM, 'normal depth');
      expectClose(flow.critical?.depth_m, critical.depthM, 1e-8 * critical.depthM, 'critical depth');
      expectClose(flow.normal?.velocity_mps, state.velocityMs, RELATIVE * state.velocityMs, 'velocity');
      expectClose(flow.normal?.froudeNumber, state.froudeNumber, RELATIVE, 'Froude number');
      expectClose(flow.normal?.topWidth_m, state.topWidthM, RELATIVE * state.topWidthM, 'top width');
      expectClose(flow.normal?.hydraulicRadius_m, state.hydraulicRadiusM, RELATIVE * state.hydraulicRadiusM, 'hydraulic radius');
      expectClose(flow.normal?.specificEnergy_m, state.specificEnergyM, RELATIVE * state.specificEnergyM, 'specific energy');
      const shear = boundaryShear(normal.depthM, state.hydraulicRadiusM, bedSlope);
      expectClose(flow.maxShear_Pa, shear.maximumPa, RELATIVE * shear.maximumPa, 'maximum shear');
      expectClose(flow.averageShear_Pa, shear.averagePa, RELATIVE * shear.averagePa, 'average shear');
      // tau_d = gamma y S with gamma = 9,810 N/m3 (FHWA HEC-15 3rd ed. 2005, Eq. 3.1; confirmed).
      expectClose(flow.maxShear_Pa, 9810 * normal.depthM * bedSlope, RELATIVE * 9810 * normal.depthM * bedSlope, 'gamma y S');
      expectClose(flow.freeboard_m, bankM - normal.depthM, 1e-12, 'freeboard');
      expectClose(flow.requiredFreeboard_m, 0.5 * FOOT_M, 1e-12, 'required freeboard (criteria: 0.5 ft)');
      const slopeOfCriticalFlow = criticalSlope(section, dischargeM3s, manningN);
      if (!slopeOfCriticalFlow.converged) throw new Error('critical slope did not converge');
      expectClose(flow.criticalSlope, slopeOfCriticalFlow.slope, 1e-8 * slopeOfCriticalFlow.slope, 'critical slope');
      expectClose(reach.bankfullCapacity_m3s, manningDischargeM3s(section, bankM, manningN, bedSlope), 1e-9, 'bank-full capacity');
    });
  }
});

describe('storm-drain-outfall.runnel, reach outfall/pipe-upper, against the engine', () => {
  // 36 in pipe, concrete-trowel n 0.013, inverts 742.10 ft to 740.50 ft over 320 ft.
  const section = circleSection({ diameterM: 36 * 0.0254 });
  const bedSlope = (742.1 - 740.5) / 320;

  it('full-pipe capacity as the engine computes it, and the closed form (1/n) A R^(2/3) S^(1/2) with A = pi D^2/4, R = D/4 (derived)', async () => {
    const reach = reachOf(await sampleAnalysis('storm-drain-outfall.runnel'), 'outfall', 'pipe-upper');
    const diameterM = 36 * 0.0254;
    const closedForm = (1 / 0.013) * ((Math.PI * diameterM ** 2) / 4) * (diameterM / 4) ** (2 / 3) * Math.sqrt(bedSlope);
    expectClose(reach.bankfullCapacity_m3s, fullFlowCapacityM3s(section, 0.013, bedSlope) ?? Number.NaN, 1e-9, 'full-pipe capacity vs engine');
    expectClose(reach.bankfullCapacity_m3s, closedForm, 1e-6 * closedForm, 'full-pipe capacity vs closed form');
    expect(reach.section.fullDepth_m).toBeCloseTo(diameterM, 12);
    expect(reach.section.bankDepth_m).toBeNull();
  });

  it('q10 (38 cfs) runs partly full at the engine normal depth', async () => {
    const flow = flowOf(reachOf(await sampleAnalysis('storm-drain-outfall.runnel'), 'outfall', 'pipe-upper'), 'q10');
    const normal = solveNormalDepth(section, { dischargeM3s: 38 * CFS_M3S, manningN: 0.013, bedSlope });
    if (!normal.converged) throw new Error('engine did not converge');
    expectClose(flow.normal?.depth_m, normal.depthM, RELATIVE * normal.depthM, 'normal depth');
    expect(flow.normal?.depth_m ?? 1).toBeLessThan(36 * 0.0254);
  });
});
