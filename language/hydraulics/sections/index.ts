/**
 * The registry of section shapes: adding a shape means one new module beside this file and one line here.
 */
import { circleSection, type CircleDimensions } from './circle.js';
import { parabolaSection, type ParabolaDimensions } from './parabola.js';
import { rectangleSection, type RectangleDimensions } from './rectangle.js';
import type { SectionGeometry, SectionShape } from './section-geometry.js';
import { trapezoidSection, type TrapezoidDimensions } from './trapezoid.js';
import { triangleSection, type TriangleDimensions } from './triangle.js';

export * from './section-geometry.js';
export { circleSection, parabolaSection, rectangleSection, trapezoidSection, triangleSection };
export type { CircleDimensions, ParabolaDimensions, RectangleDimensions, TrapezoidDimensions, TriangleDimensions };

/** Dimensions of each shape, keyed by shape name (all SI). */
export interface SectionDimensionsByShape {
  rectangle: RectangleDimensions;
  trapezoid: TrapezoidDimensions;
  triangle: TriangleDimensions;
  parabola: ParabolaDimensions;
  circle: CircleDimensions;
}

export const SECTION_FACTORIES: { readonly [S in SectionShape]: (dimensions: SectionDimensionsByShape[S]) => SectionGeometry } = {
  rectangle: rectangleSection,
  trapezoid: trapezoidSection,
  triangle: triangleSection,
  parabola: parabolaSection,
  circle: circleSection,
};
