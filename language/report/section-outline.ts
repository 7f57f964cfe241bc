/**
 * The drawn shape of a cross-section, in metres: x is the horizontal offset from the centre of the bed (the
 * vertex of a V, the axis of a parabola or conduit), positive to the right looking downstream; y is the height
 * above the invert. Water-surface edges come from the same dimensions the engine uses, so the width drawn at a
 * depth equals the engine's top width at that depth (checked in test/report/section-outline.test.ts).
 */
import type { SectionGeometry } from '../hydraulics/index.js';
import type { SectionResult } from '../analysis/model.js';

export interface PointM {
  /** Offset from the bed centre, m. */
  readonly x: number;
  /** Height above the invert, m. */
  readonly y: number;
}

/** Points per drawn curve (parabola side, conduit circumference): smooth at report scale, small in the file. */
const CURVE_SAMPLES = 48;

/** Left and right edges of the water surface (or of the section) at a depth, m from the bed centre. */
export function surfaceEdgesM(section: SectionResult, geometry: SectionGeometry, depthM: number): { readonly leftM: number; readonly rightM: number } {
  const y = Math.max(depthM, 0);
  if (section.shape === 'trapezoid' || section.shape === 'triangle') {
    const halfBottomM = section.shape === 'trapezoid' ? (section.dimensions['bottomWidth_m'] ?? 0) / 2 : 0;
    const leftSlope = section.dimensions['leftSideSlope_HV'] ?? 0;
    const rightSlope = section.dimensions['rightSideSlope_HV'] ?? 0;
    return { leftM: -halfBottomM - leftSlope * y, rightM: halfBottomM + rightSlope * y };
  }
  // Rectangle, parabola and circle are symmetric about the bed centre.
  const halfWidthM = geometry.topWidthM(y) / 2;
  return { leftM: -halfWidthM, rightM: halfWidthM };
}

/**
 * The section boundary up to `topDepthM`: for an open section from the left edge at the top, down the left side,
 * along the bed and up to the right edge at the top; for a closed conduit the whole circumference (closed loop,
 * `topDepthM` ignored).
 */
export function sectionBoundaryM(section: SectionResult, geometry: SectionGeometry, topDepthM: number): { readonly points: readonly PointM[]; readonly closed: boolean } {
  const top = Math.max(topDepthM, 0);
  switch (section.shape) {
    case 'circle': {
      const radiusM = (geometry.fullDepthM ?? 0) / 2;
      const points: PointM[] = [];
      for (let index = 0; index < CURVE_SAMPLES * 2; index++) {
        // Start at the crown and go round anticlockwise (left side first), in metres above the invert.
        const angle = Math.PI / 2 + (index / (CURVE_SAMPLES * 2)) * 2 * Math.PI;
        points.push({ x: radiusM * Math.cos(angle), y: radiusM + radiusM * Math.sin(angle) });
      }
      return { points, closed: true };
    }
    case 'parabola': {
      const halfTopM = geometry.topWidthM(top) / 2;
      const points: PointM[] = [];
      for (let index = 0; index <= CURVE_SAMPLES; index++) {
        // Uniform in x: y = top (x / X)^2 is the parabola through the bed centre and both top edges.
        const x = -halfTopM + (2 * halfTopM * index) / CURVE_SAMPLES;
        points.push({ x, y: halfTopM > 0 ? top * (x / halfTopM) ** 2 : 0 });
      }
      return { points, closed: false };
    }
    default: {
      const atTop = surfaceEdgesM(section, geometry, top);
      const atBed = surfaceEdgesM(section, geometry, 0);
      const points: PointM[] = [{ x: atTop.leftM, y: top }, { x: atBed.leftM, y: 0 }];
      if (atBed.rightM > atBed.leftM) points.push({ x: atBed.rightM, y: 0 });
      points.push({ x: atTop.rightM, y: top });
      return { points, closed: false };
    }
  }
}

/**
 * The part of a polygon at or below a horizontal line (Sutherland-Hodgman clipping against one half-plane). The
 * boundary of an open section, closed by its top edge, clipped at a water depth is the flow area.
 */
export function clipPolygonBelow(polygon: readonly PointM[], levelM: number): PointM[] {
  const clipped: PointM[] = [];
  for (let index = 0; index < polygon.length; index++) {
    const current = polygon[index]!;
    const previous = polygon[(index + polygon.length - 1) % polygon.length]!;
    const currentInside = current.y <= levelM;
    const previousInside = previous.y <= levelM;
    if (currentInside !== previousInside) {
      const fraction = (levelM - previous.y) / (current.y - previous.y);
      clipped.push({ x: previous.x + fraction * (current.x - previous.x), y: levelM });
    }
    if (currentInside) clipped.push(current);
  }
  return clipped;
}

/** Area of a simple polygon by the shoelace formula, m2 (used by the tests to compare with the engine's area). */
export function polygonAreaM2(polygon: readonly PointM[]): number {
  let twiceArea = 0;
  for (let index = 0; index < polygon.length; index++) {
    const current = polygon[index]!;
    const next = polygon[(index + 1) % polygon.length]!;
    twiceArea += current.x * next.y - next.x * current.y;
  }
  return Math.abs(twiceArea) / 2;
}
