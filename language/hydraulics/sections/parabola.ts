/**
 * Parabolic open channel (typical of grassed swales), given its top width Tr (m) at a reference depth yr (m).
 * The bed is x = a sqrt(y) on each side with a = Tr / (2 sqrt(yr)), so T(y) = Tr sqrt(y / yr), A = 2/3 T y, and the
 * centroid lies 2/5 y below the surface (Chow 1959, Table 2-1). The wetted perimeter is the exact arc length
 * P = X sqrt(1 + k^2 X^2) + asinh(k X) / k with X = T/2 and k = 2 / a^2 (twice the arc length of y = x^2 / a^2),
 * not the series approximation P = T + 8 y^2 / (3 T) that the table gives for shallow sections.
 * Critical depth has a closed form: with T = c sqrt(y), c = Tr / sqrt(yr), the section factor is
 * Z = A sqrt(A/T) = (2/3)^(3/2) c y^2.
 */
import { positiveLengthProblem, TERM_AREA, TERM_TOP_WIDTH, TERM_TOP_WIDTH_SLOPE, TERM_WETTED_PERIMETER, TERM_WETTED_PERIMETER_SLOPE, type SectionGeometry } from './section-geometry.js';

export interface ParabolaDimensions {
  readonly topWidthM: number;
  readonly atDepthM: number;
}

export function parabolaSection({ topWidthM: referenceTopWidthM, atDepthM: referenceDepthM }: ParabolaDimensions): SectionGeometry {
  const halfWidthCoefficient = referenceTopWidthM / (2 * Math.sqrt(referenceDepthM)); // a, m^(1/2)
  const curvature = 2 / (halfWidthCoefficient * halfWidthCoefficient); // k, 1/m
  const widthCoefficient = referenceTopWidthM / Math.sqrt(referenceDepthM); // c, m^(1/2): T = c sqrt(y)
  const topWidthM = (y: number): number => referenceTopWidthM * Math.sqrt(Math.max(y, 0) / referenceDepthM);
  // Normal-depth start, in logs: shallow limit P ~ T gives K = (2/3)^(5/3) c y^(13/6); deep limit P ~ 2y gives
  // K = ((2/3) c)^(5/3) 2^(-2/3) y^(11/6). P exceeds both T and 2y, so the depth lies above both limits; the soft
  // maximum (yShallow^p + yDeep^p)^(1/p) with p = 5 starts within 1% over the swale ranges of test/bench/engine.ts
  // (measured). It only chooses where the iteration starts.
  const logShallowCoefficient = (5 / 3) * Math.log(2 / 3) + Math.log(widthCoefficient);
  const logDeepCoefficient = (5 / 3) * Math.log((2 / 3) * widthCoefficient) - (2 / 3) * Math.log(2);
  const criticalCoefficient = (2 / 3) ** 1.5 * widthCoefficient;
  const areaM2 = (y: number): number => (2 / 3) * topWidthM(y) * y;
  const wettedPerimeterM = (y: number): number => {
    const halfWidthM = topWidthM(y) / 2;
    const kx = curvature * halfWidthM;
    return halfWidthM * Math.sqrt(1 + kx * kx) + Math.asinh(kx) / curvature;
  };
  // dP/dy = 2 sqrt(1 + (dx/dy)^2) with dx/dy = a / (2 sqrt y).
  const wettedPerimeterSlope = (y: number): number => {
    if (y <= 0) return Number.POSITIVE_INFINITY;
    const dxdy = halfWidthCoefficient / (2 * Math.sqrt(y));
    return 2 * Math.sqrt(1 + dxdy * dxdy);
  };
  const topWidthSlope = (y: number): number => (y > 0 ? topWidthM(y) / (2 * y) : Number.POSITIVE_INFINITY);
  return {
    shape: 'parabola',
    description: `parabola, top width ${Number(referenceTopWidthM.toPrecision(4))} m at depth ${Number(referenceDepthM.toPrecision(4))} m`,
    fullDepthM: undefined,
    areaM2,
    wettedPerimeterM,
    topWidthM,
    firstMomentM3: (y) => (4 / 15) * topWidthM(y) * y * y,
    wettedPerimeterSlope,
    topWidthSlope,
    fillHydraulicTerms: (y, terms) => {
      terms[TERM_AREA] = areaM2(y);
      terms[TERM_WETTED_PERIMETER] = wettedPerimeterM(y);
      terms[TERM_TOP_WIDTH] = topWidthM(y);
      terms[TERM_WETTED_PERIMETER_SLOPE] = wettedPerimeterSlope(y);
      terms[TERM_TOP_WIDTH_SLOPE] = topWidthSlope(y);
    },
    dimensionProblem: positiveLengthProblem('reference top width', referenceTopWidthM) ?? positiveLengthProblem('reference depth', referenceDepthM),
    solverHints: {
      normalDepthEstimateM: (conveyanceM83) => {
        const logConveyance = Math.log(conveyanceM83);
        const logShallowDepth = (6 / 13) * (logConveyance - logShallowCoefficient);
        const logDeepDepth = (6 / 11) * (logConveyance - logDeepCoefficient);
        const x = 5 * (logDeepDepth - logShallowDepth);
        return Math.exp(logShallowDepth + 0.2 * (x > 35 ? x : Math.log1p(Math.exp(x))));
      },
      criticalDepthEstimateM: (sectionFactorM52) => Math.sqrt(sectionFactorM52 / criticalCoefficient),
    },
  };
}
