/**
 * Trapezoidal open channel with independent side slopes: bottom width b (m), left side zL and right side zR
 * horizontal per 1 vertical. A = b y + (zL + zR) y^2 / 2, P = b + y (sqrt(1 + zL^2) + sqrt(1 + zR^2)),
 * T = b + (zL + zR) y (Chow 1959, Table 2-1, generalised to unequal sides). b = 0 is a V-ditch and zL = zR = 0 a
 * rectangle; both sides vertical with no bottom is not a channel.
 */
import {
  positiveLengthProblem,
  sideSlopeProblem,
  TERM_AREA,
  TERM_TOP_WIDTH,
  TERM_TOP_WIDTH_SLOPE,
  TERM_WETTED_PERIMETER,
  TERM_WETTED_PERIMETER_SLOPE,
  type SectionGeometry,
  type SectionSolverHints,
} from './section-geometry.js';

export interface TrapezoidDimensions {
  readonly bottomWidthM: number;
  readonly leftSideSlopeHV: number;
  readonly rightSideSlopeHV: number;
}

export function trapezoidSection(dimensions: TrapezoidDimensions): SectionGeometry {
  const { bottomWidthM, leftSideSlopeHV, rightSideSlopeHV } = dimensions;
  const sideSlopeSum = leftSideSlopeHV + rightSideSlopeHV;
  const sideLengthPerDepth = Math.hypot(1, leftSideSlopeHV) + Math.hypot(1, rightSideSlopeHV);
  const areaM2 = (y: number): number => y * (bottomWidthM + (sideSlopeSum * y) / 2);
  const wettedPerimeterM = (y: number): number => bottomWidthM + sideLengthPerDepth * y;
  const topWidthM = (y: number): number => bottomWidthM + sideSlopeSum * y;
  return {
    shape: 'trapezoid',
    description: `trapezoid, bottom ${Number(bottomWidthM.toPrecision(4))} m, sides ${leftSideSlopeHV}:1 and ${rightSideSlopeHV}:1 (H:V)`,
    fullDepthM: undefined,
    areaM2,
    wettedPerimeterM,
    topWidthM,
    // Rectangle part b y^2/2 plus the two side triangles, each z y^2/2 with centroid y/3 below the surface.
    firstMomentM3: (y) => (bottomWidthM * y * y) / 2 + (sideSlopeSum * y * y * y) / 6,
    wettedPerimeterSlope: () => sideLengthPerDepth,
    topWidthSlope: () => sideSlopeSum,
    fillHydraulicTerms: (y, terms) => {
      terms[TERM_AREA] = areaM2(y);
      terms[TERM_WETTED_PERIMETER] = wettedPerimeterM(y);
      terms[TERM_TOP_WIDTH] = topWidthM(y);
      terms[TERM_WETTED_PERIMETER_SLOPE] = sideLengthPerDepth;
      terms[TERM_TOP_WIDTH_SLOPE] = sideSlopeSum;
    },
    dimensionProblem: trapezoidProblem(bottomWidthM, leftSideSlopeHV, rightSideSlopeHV),
    solverHints: trapezoidEstimates(bottomWidthM, sideSlopeSum, sideLengthPerDepth),
  };
}

function trapezoidProblem(bottomWidthM: number, leftSideSlopeHV: number, rightSideSlopeHV: number): string | undefined {
  const sideProblem = sideSlopeProblem('left side slope', leftSideSlopeHV) ?? sideSlopeProblem('right side slope', rightSideSlopeHV);
  if (sideProblem !== undefined) return sideProblem;
  if (bottomWidthM === 0 && leftSideSlopeHV + rightSideSlopeHV > 0) return undefined;
  return positiveLengthProblem('bottom width', bottomWidthM);
}

/**
 * Solver starts from the two limits of the section: a wide rectangle of width b (conveyance b y^(5/3), section
 * factor b y^(3/2)) and the V-ditch formed by the sides alone (closed forms as in triangle.ts). The depth always
 * lies below the V-ditch depth and near the smaller of the two; the soft minimum yWide yVee / sqrt(yWide^2 + yVee^2)
 * starts within about 10% (normal depth) and 3% (critical depth) over the design ranges of test/bench/engine.ts, for
 * about 3.6 and 3.3 evaluations per solve (measured). A sharper blend (exponent 2.5 in place of 2) saves half an
 * evaluation but costs two more transcendental calls, which on this engine take longer than the evaluation saved.
 * It only chooses where the iteration starts.
 */
function trapezoidEstimates(bottomWidthM: number, sideSlopeSum: number, sideLengthPerDepth: number): SectionSolverHints {
  if (!(bottomWidthM > 0 && sideSlopeSum > 0)) return {};
  const logBottomWidth = Math.log(bottomWidthM);
  // ln of the V-ditch coefficients: K = cK y^(8/3), Z = cZ y^(5/2).
  const logVeeConveyanceCoefficient = (5 / 3) * Math.log(sideSlopeSum / 2) - (2 / 3) * Math.log(sideLengthPerDepth);
  const logVeeSectionFactorCoefficient = Math.log(sideSlopeSum / 2 ** 1.5);
  return {
    normalDepthEstimateM: (conveyanceM83) => {
      const logConveyance = Math.log(conveyanceM83);
      return softMinimum(Math.exp(0.6 * (logConveyance - logBottomWidth)), Math.exp(0.375 * (logConveyance - logVeeConveyanceCoefficient)));
    },
    criticalDepthEstimateM: (sectionFactorM52) => {
      const logSectionFactor = Math.log(sectionFactorM52);
      return softMinimum(Math.exp((2 / 3) * (logSectionFactor - logBottomWidth)), Math.exp(0.4 * (logSectionFactor - logVeeSectionFactorCoefficient)));
    },
  };
}

/** (a^-2 + b^-2)^(-1/2), scaled so that neither square overflows. */
function softMinimum(a: number, b: number): number {
  const larger = Math.max(a, b);
  const smaller = Math.min(a, b);
  const ratio = smaller / larger;
  return smaller / Math.sqrt(1 + ratio * ratio);
}
