/** Rectangular open channel: bottom width b (m), vertical walls. A = b y, P = b + 2y, T = b. */
import type { SectionGeometry } from './section-geometry.js';

export interface RectangleDimensions {
  readonly bottomWidthM: number;
}

export function rectangleSection({ bottomWidthM }: RectangleDimensions): SectionGeometry {
  return {
    shape: 'rectangle',
    description: `rectangle, width ${round(bottomWidthM)} m`,
    fullDepthM: undefined,
    areaM2: (y) => bottomWidthM * y,
    wettedPerimeterM: (y) => bottomWidthM + 2 * y,
    topWidthM: () => bottomWidthM,
    firstMomentM3: (y) => (bottomWidthM * y * y) / 2,
    wettedPerimeterSlope: () => 2,
    topWidthSlope: () => 0,
  };
}

function round(valueM: number): string {
  return Number(valueM.toPrecision(4)).toString();
}
