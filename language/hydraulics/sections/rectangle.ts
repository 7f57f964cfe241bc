/**
 * Rectangular open channel: bottom width b (m), vertical walls. A = b y, P = b + 2y, T = b (Chow 1959, Table 2-1).
 * Critical depth has the closed form yc = (q^2 / g)^(1/3), q = Q / b, i.e. y = (Z / b)^(2/3) for section factor Z.
 */
import { positiveLengthProblem, TERM_AREA, TERM_TOP_WIDTH, TERM_TOP_WIDTH_SLOPE, TERM_WETTED_PERIMETER, TERM_WETTED_PERIMETER_SLOPE, type SectionGeometry } from './section-geometry.js';

export interface RectangleDimensions {
  readonly bottomWidthM: number;
}

export function rectangleSection({ bottomWidthM }: RectangleDimensions): SectionGeometry {
  const logBottomWidth = Math.log(bottomWidthM);
  const narrowConveyancePerDepth = bottomWidthM ** (5 / 3) / 2 ** (2 / 3);
  const areaM2 = (y: number): number => bottomWidthM * y;
  const wettedPerimeterM = (y: number): number => bottomWidthM + 2 * y;
  return {
    shape: 'rectangle',
    description: `rectangle, width ${round(bottomWidthM)} m`,
    fullDepthM: undefined,
    areaM2,
    wettedPerimeterM,
    topWidthM: () => bottomWidthM,
    firstMomentM3: (y) => (bottomWidthM * y * y) / 2,
    wettedPerimeterSlope: () => 2,
    topWidthSlope: () => 0,
    fillHydraulicTerms: (y, terms) => {
      terms[TERM_AREA] = areaM2(y);
      terms[TERM_WETTED_PERIMETER] = wettedPerimeterM(y);
      terms[TERM_TOP_WIDTH] = bottomWidthM;
      terms[TERM_WETTED_PERIMETER_SLOPE] = 2;
      terms[TERM_TOP_WIDTH_SLOPE] = 0;
    },
    dimensionProblem: positiveLengthProblem('bottom width', bottomWidthM),
    solverHints: {
      // Starts from the two limits: wide (P ~ b, K = b y^(5/3)) and narrow (P ~ 2y, K = b^(5/3) 2^(-2/3) y). P
      // exceeds both b and 2y, so the depth lies above both; their root-sum-square starts within 2.5% over the
      // ranges of test/bench/engine.ts (measured), with one exponential and one logarithm.
      normalDepthEstimateM: (conveyanceM83) => {
        const wideDepthM = Math.exp(0.6 * (Math.log(conveyanceM83) - logBottomWidth));
        const narrowDepthM = conveyanceM83 / narrowConveyancePerDepth;
        return Math.sqrt(wideDepthM * wideDepthM + narrowDepthM * narrowDepthM);
      },
      // Z = b y^(3/2) exactly.
      criticalDepthEstimateM: (sectionFactorM52) => Math.cbrt((sectionFactorM52 / bottomWidthM) ** 2),
    },
  };
}

function round(valueM: number): string {
  return Number(valueM.toPrecision(4)).toString();
}
