/**
 * The one interface every cross-section shape implements. All lengths in metres, depth y measured from the
 * lowest point of the section (invert) to the water surface. Open shapes are defined for any y >= 0 (the prism is
 * extended above the bank: over-topping is a check of the analysis, not a failure to solve); closed shapes are
 * defined for 0 <= y <= fullDepthM and clamp above it.
 */
export type SectionShape = 'rectangle' | 'trapezoid' | 'triangle' | 'parabola' | 'circle';

export interface SectionGeometry {
  readonly shape: SectionShape;
  /** Plain-words description in SI, for provenance ("trapezoid, bottom 1.83 m, sides 3:1 and 3:1"). */
  readonly description: string;
  /** Inside height of a closed conduit, m; undefined for open shapes. */
  readonly fullDepthM: number | undefined;
  /** Flow area A(y), m2. */
  areaM2(depthM: number): number;
  /** Wetted perimeter P(y), m. */
  wettedPerimeterM(depthM: number): number;
  /** Top width of the water surface T(y) = dA/dy, m. */
  topWidthM(depthM: number): number;
  /** First moment of the flow area about the water surface, A times centroid depth below it, m3 (specific force). */
  firstMomentM3(depthM: number): number;
  /** dP/dy, dimensionless (for Newton steps on conveyance). */
  wettedPerimeterSlope(depthM: number): number;
  /** dT/dy, dimensionless (for Newton steps on the critical-flow section factor). */
  topWidthSlope(depthM: number): number;
  /**
   * A, P, T, dP/dy and dT/dy at one depth, written into `terms` at the TERM_* slots: the values of the five
   * functions above, bit for bit, from one call. Why: the depth solvers and the standard step evaluate sections of
   * every shape in turn, and a call through a section object whose shape keeps changing is a full call each time;
   * one such call whose body calls the shape's own functions costs one (measured over alternating runs of the
   * engine benchmark, trapezoid normal depths solved after rectangles: medians about 2.1 million per second with a
   * call per term, 2.45 million with one call).
   */
  fillHydraulicTerms(depthM: number, terms: Float64Array): void;
  /**
   * Why these dimensions cannot describe a channel (one sentence, SI), or undefined when they can. The factories
   * never throw on bad numbers; the solvers turn this into an 'invalid-input' result instead.
   */
  readonly dimensionProblem?: string | undefined;
  /** Facts a shape knows in closed form that let the depth solvers start close to the answer. Optional. */
  readonly solverHints?: SectionSolverHints | undefined;
}

/**
 * Optional knowledge a shape offers the depth solvers. Estimates only choose where the iteration starts: any
 * positive depth is safe, because the solver keeps its iterate inside a bracket and accepts a depth only when the
 * defining equation holds to tolerance. A close estimate saves evaluations; an exact one (a closed form) needs one.
 */
export interface SectionSolverHints {
  /** First estimate of normal depth, m, for a Manning conveyance K = A R^(2/3) = Q n / sqrt(S), m^(8/3). */
  normalDepthEstimateM?(conveyanceM83: number): number;
  /** First estimate of critical depth, m, for a section factor Z = A sqrt(A/T) = Q / sqrt(g), m^(5/2). */
  criticalDepthEstimateM?(sectionFactorM52: number): number;
  /** Closed shapes: where conveyance peaks and its values there and flowing full (else found numerically). */
  readonly conduitConveyance?: ConduitConveyance;
}

/** Slots of the array SectionGeometry.fillHydraulicTerms writes (newHydraulicTerms makes one). */
export const TERM_AREA = 0;
export const TERM_WETTED_PERIMETER = 1;
export const TERM_TOP_WIDTH = 2;
export const TERM_WETTED_PERIMETER_SLOPE = 3;
export const TERM_TOP_WIDTH_SLOPE = 4;

/** An array for SectionGeometry.fillHydraulicTerms (hot loops keep one and reuse it). */
export function newHydraulicTerms(): Float64Array {
  return new Float64Array(5);
}

/** Conveyance facts of a closed conduit (constant n). */
export interface ConduitConveyance {
  /** Depth of greatest conveyance A R^(2/3), m (0.9382 D for a circle). */
  readonly peakDepthM: number;
  /** Conveyance at that depth, m^(8/3). */
  readonly peakConveyanceM83: number;
  /** Conveyance flowing full, m^(8/3). */
  readonly fullConveyanceM83: number;
}

/** Hydraulic radius R = A/P, m. Zero at zero depth. */
export function hydraulicRadiusM(section: SectionGeometry, depthM: number): number {
  const perimeterM = section.wettedPerimeterM(depthM);
  return perimeterM > 0 ? section.areaM2(depthM) / perimeterM : 0;
}

/** Hydraulic depth D = A/T, m. Infinite for a full closed conduit (T = 0), which callers treat as "no free surface". */
export function hydraulicDepthM(section: SectionGeometry, depthM: number): number {
  return section.areaM2(depthM) / section.topWidthM(depthM);
}

/**
 * A problem sentence when `value` is not a positive finite length in metres, else undefined (shared by the shape
 * factories so their messages read alike).
 */
export function positiveLengthProblem(name: string, value: number): string | undefined {
  return value > 0 && Number.isFinite(value) ? undefined : `The ${name} must be a positive finite length (got ${String(value)} m).`;
}

/** A problem sentence when a side slope (H:V) is not a finite number >= 0, else undefined. */
export function sideSlopeProblem(name: string, value: number): string | undefined {
  return value >= 0 && Number.isFinite(value) ? undefined : `The ${name} must be a finite horizontal-to-vertical ratio of 0 or more (got ${String(value)}).`;
}
