/**
 * Classification of gradually-varied-flow profiles (Chow 1959, Ch. 9, Table 9-1): the letter is the bed-slope
 * class (Mild, Steep, Critical, Horizontal, Adverse), the number the zone of the depth relative to normal depth yn
 * and critical depth yc:
 *   M1 y > yn > yc,  M2 yn > y > yc,  M3 yn > yc > y;
 *   S1 y > yc > yn,  S2 yc > y > yn,  S3 yc > yn > y;
 *   C1 y > yc = yn,  C3 y < yc = yn;
 *   H2 y > yc, H3 y < yc on a horizontal bed; A2, A3 likewise on an adverse bed.
 * There is no C2, H1 or A1. A depth exactly on a boundary goes to the zone above it.
 */
import type { SlopeClass } from '../critical-flow.js';
import { NORMAL_DEPTH_BAND_RATIO } from './profile-defaults.js';
import type { ProfileClass, SegmentClass } from './profile-types.js';

/**
 * The profile class of depth y (m) in a reach of the given slope class with normal depth yn (m; ignored on
 * horizontal and adverse beds, where there is none) and critical depth yc (m).
 */
export function classifyProfile(slopeClass: SlopeClass, depthM: number, normalDepthM: number | undefined, criticalDepthM: number): ProfileClass {
  switch (slopeClass) {
    case 'horizontal':
      return depthM >= criticalDepthM ? 'H2' : 'H3';
    case 'adverse':
      return depthM >= criticalDepthM ? 'A2' : 'A3';
    case 'critical':
      return depthM >= criticalDepthM ? 'C1' : 'C3';
    case 'mild': {
      // A conduit flowing beyond its capacity has no normal depth: it lies above the crown, above any profile depth.
      const normal = normalDepthM ?? Number.POSITIVE_INFINITY;
      if (depthM >= normal) return 'M1';
      return depthM >= criticalDepthM ? 'M2' : 'M3';
    }
    case 'steep': {
      const normal = normalDepthM ?? 0;
      if (depthM >= criticalDepthM) return 'S1';
      return depthM >= normal ? 'S2' : 'S3';
    }
  }
}

/**
 * A segment's class from a representative depth: 'uniform' within NORMAL_DEPTH_BAND_RATIO of normal depth
 * (where an M1, M2, S2 or S3 curve has all but reached it), otherwise the profile class.
 */
export function classifySegment(slopeClass: SlopeClass, depthM: number, normalDepthM: number | undefined, criticalDepthM: number): SegmentClass {
  if (normalDepthM !== undefined && (slopeClass === 'mild' || slopeClass === 'steep' || slopeClass === 'critical')) {
    if (Math.abs(depthM - normalDepthM) <= NORMAL_DEPTH_BAND_RATIO * normalDepthM) return 'uniform';
  }
  return classifyProfile(slopeClass, depthM, normalDepthM, criticalDepthM);
}

const SEGMENT_DESCRIPTIONS: { readonly [C in SegmentClass]: string } = {
  M1: 'M1 backwater curve (mild slope, above normal depth)',
  M2: 'M2 drawdown curve (mild slope, between normal and critical depth)',
  M3: 'M3 curve (mild slope, supercritical, below critical depth)',
  S1: 'S1 backwater curve (steep slope, subcritical, above critical depth)',
  S2: 'S2 drawdown curve (steep slope, between critical and normal depth)',
  S3: 'S3 curve (steep slope, below normal depth)',
  C1: 'C1 curve (critical slope, above critical depth)',
  C3: 'C3 curve (critical slope, below critical depth)',
  H2: 'H2 drawdown curve (horizontal bed, subcritical)',
  H3: 'H3 curve (horizontal bed, supercritical)',
  A2: 'A2 drawdown curve (adverse slope, subcritical)',
  A3: 'A3 curve (adverse slope, supercritical)',
  uniform: `at normal depth (uniform flow, within ${NORMAL_DEPTH_BAND_RATIO * 100} % of normal depth)`,
};

/** One phrase for people describing a segment class. */
export function describeSegmentClass(segmentClass: SegmentClass): string {
  return SEGMENT_DESCRIPTIONS[segmentClass];
}
