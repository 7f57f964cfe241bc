/**
 * Boundary shear in uniform flow: maximum on the bed tau_d = gamma d S (FHWA HEC-15 3rd ed., 2005, Eq. 3.1;
 * confirmed) and average tau = gamma R S, with gamma = 9,810 N/m3 = 62.4 lb/ft3 (common practice).
 */
import { describe, it } from 'vitest';
import { boundaryShear, hydraulicRadiusM, solveNormalDepth, trapezoidSection, UNIT_WEIGHT_OF_WATER_NM3 } from '../../language/hydraulics/index.js';
import { fromSI } from '../../language/units/units.js';
import { expectRelative } from './engineering-check.js';

const HEC15 = 'Maximum shear on the bottom tau_d = gamma d S (FHWA HEC-15 3rd ed., 2005, Eq. 3.1; confirmed)';

describe('boundary shear', () => {
  it('Eq. 3.1 in SI: 0.5 m deep on a 2% slope gives 9810 x 0.5 x 0.02 = 98.1 Pa', () => {
    const shear = boundaryShear(0.5, 0.3, 0.02);
    expectRelative({ id: 'HEC15-3.1', source: HEC15, input: 'd = 0.5 m, S = 0.02, gamma = 9810 N/m3', value: shear.maximumPa, expected: 98.1, relativeTolerance: 1e-12, unit: 'Pa' });
    expectRelative({ id: 'average', source: 'average tau = gamma R S (confirmed)', input: 'R = 0.3 m, S = 0.02', value: shear.averagePa, expected: 58.86, relativeTolerance: 1e-12, unit: 'Pa' });
  });

  it('Eq. 3.1 in US units: 62.4 lb/ft3 x d (ft) x S, to within the 0.07% between the two customary unit weights', () => {
    const depthFt = 2.2;
    const shear = boundaryShear(depthFt * 0.3048, 1, 0.004);
    expectRelative({ id: 'HEC15-3.1-US', source: `${HEC15}; 62.4 lb/ft3 (common practice)`, input: 'd = 2.2 ft, S = 0.004', value: fromSI(shear.maximumPa, 'psf'), expected: 62.4 * depthFt * 0.004, relativeTolerance: 1e-3, unit: 'psf' });
    // The SI unit weight converts to 62.45 lb/ft3 with the exact factors of the unit table.
    expectRelative({ id: 'gamma', source: 'Unit weight of water: 9,810 N/m3 = 62.4 lb/ft3 (common practice)', input: '9810 N/m3 in lb/ft3', value: fromSI(UNIT_WEIGHT_OF_WATER_NM3, 'psf') * 0.3048, expected: 62.4, relativeTolerance: 1e-3, unit: 'lb/ft3' });
  });

  it('at normal depth in a channel, maximum exceeds average (y > R) in the ratio y/R', () => {
    const section = trapezoidSection({ bottomWidthM: 1, leftSideSlopeHV: 3, rightSideSlopeHV: 3 });
    const normal = solveNormalDepth(section, { dischargeM3s: 2, manningN: 0.035, bedSlope: 0.01 });
    if (!normal.converged) throw new Error(normal.message);
    const radiusM = hydraulicRadiusM(section, normal.depthM);
    const shear = boundaryShear(normal.depthM, radiusM, 0.01);
    expectRelative({ id: 'ratio', source: 'tau_d / tau_avg = d / R (derived)', input: `trapezoid b = 1 m, 3:1, Q = 2 m3/s, yn = ${normal.depthM}`, value: shear.maximumPa / shear.averagePa, expected: normal.depthM / radiusM, relativeTolerance: 1e-14, unit: '-' });
  });
});
