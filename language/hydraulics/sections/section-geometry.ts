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
