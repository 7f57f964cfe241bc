/**
 * Triangular (V) open channel with independent side slopes zL, zR (H:V). A = (zL + zR) y^2 / 2,
 * P = y (sqrt(1 + zL^2) + sqrt(1 + zR^2)), T = (zL + zR) y; centroid at y/3 below the surface (Chow 1959,
 * Table 2-1, generalised to unequal sides). Both depths have closed forms, used as exact solver starts:
 * conveyance K = (Zs/2)^(5/3) m^(-2/3) y^(8/3) and section factor Z = Zs y^(5/2) / 2^(3/2), with Zs = zL + zR and
 * m = sqrt(1 + zL^2) + sqrt(1 + zR^2).
 */
import { sideSlopeProblem, TERM_AREA, TERM_TOP_WIDTH, TERM_TOP_WIDTH_SLOPE, TERM_WETTED_PERIMETER, TERM_WETTED_PERIMETER_SLOPE, type SectionGeometry } from './section-geometry.js';

export interface TriangleDimensions {
  readonly leftSideSlopeHV: number;
  readonly rightSideSlopeHV: number;
}

export function triangleSection({ leftSideSlopeHV, rightSideSlopeHV }: TriangleDimensions): SectionGeometry {
  const sideSlopeSum = leftSideSlopeHV + rightSideSlopeHV;
  const sideLengthPerDepth = Math.hypot(1, leftSideSlopeHV) + Math.hypot(1, rightSideSlopeHV);
  // ln of the coefficients in K = cK y^(8/3) and Z = cZ y^(5/2).
  const logConveyanceCoefficient = (5 / 3) * Math.log(sideSlopeSum / 2) - (2 / 3) * Math.log(sideLengthPerDepth);
  const logSectionFactorCoefficient = Math.log(sideSlopeSum / 2 ** 1.5);
  const areaM2 = (y: number): number => (sideSlopeSum * y * y) / 2;
  const wettedPerimeterM = (y: number): number => sideLengthPerDepth * y;
  const topWidthM = (y: number): number => sideSlopeSum * y;
  return {
    shape: 'triangle',
    description: `triangle (V-ditch), sides ${leftSideSlopeHV}:1 and ${rightSideSlopeHV}:1 (H:V)`,
    fullDepthM: undefined,
    areaM2,
    wettedPerimeterM,
    topWidthM,
    firstMomentM3: (y) => (sideSlopeSum * y * y * y) / 6,
    wettedPerimeterSlope: () => sideLengthPerDepth,
    topWidthSlope: () => sideSlopeSum,
    fillHydraulicTerms: (y, terms) => {
      terms[TERM_AREA] = areaM2(y);
      terms[TERM_WETTED_PERIMETER] = wettedPerimeterM(y);
      terms[TERM_TOP_WIDTH] = topWidthM(y);
      terms[TERM_WETTED_PERIMETER_SLOPE] = sideLengthPerDepth;
      terms[TERM_TOP_WIDTH_SLOPE] = sideSlopeSum;
    },
    dimensionProblem:
      sideSlopeProblem('left side slope', leftSideSlopeHV) ??
      sideSlopeProblem('right side slope', rightSideSlopeHV) ??
      (sideSlopeSum > 0 ? undefined : 'A V-ditch needs at least one sloping side (both side slopes are 0).'),
    solverHints: {
      normalDepthEstimateM: (conveyanceM83) => Math.exp(0.375 * (Math.log(conveyanceM83) - logConveyanceCoefficient)),
      criticalDepthEstimateM: (sectionFactorM52) => Math.exp(0.4 * (Math.log(sectionFactorM52) - logSectionFactorCoefficient)),
    },
  };
}
