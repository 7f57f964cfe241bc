/**
 * Triangular (V) open channel with independent side slopes zL, zR (H:V). A = (zL + zR) y^2 / 2,
 * P = y (sqrt(1 + zL^2) + sqrt(1 + zR^2)), T = (zL + zR) y; centroid at y/3 below the surface.
 */
import type { SectionGeometry } from './section-geometry.js';

export interface TriangleDimensions {
  readonly leftSideSlopeHV: number;
  readonly rightSideSlopeHV: number;
}

export function triangleSection({ leftSideSlopeHV, rightSideSlopeHV }: TriangleDimensions): SectionGeometry {
  const sideSlopeSum = leftSideSlopeHV + rightSideSlopeHV;
  const sideLengthPerDepth = Math.hypot(1, leftSideSlopeHV) + Math.hypot(1, rightSideSlopeHV);
  return {
    shape: 'triangle',
    description: `triangle (V-ditch), sides ${leftSideSlopeHV}:1 and ${rightSideSlopeHV}:1 (H:V)`,
    fullDepthM: undefined,
    areaM2: (y) => (sideSlopeSum * y * y) / 2,
    wettedPerimeterM: (y) => sideLengthPerDepth * y,
    topWidthM: (y) => sideSlopeSum * y,
    firstMomentM3: (y) => (sideSlopeSum * y * y * y) / 6,
    wettedPerimeterSlope: () => sideLengthPerDepth,
    topWidthSlope: () => sideSlopeSum,
  };
}
