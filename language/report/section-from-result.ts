/**
 * Rebuilds the engine's SectionGeometry from the analysis model's SectionResult, whose dimensions are SI numbers
 * under unit-suffixed keys: bottomWidth_m, leftSideSlope_HV, rightSideSlope_HV (trapezoid, triangle; rectangle
 * uses bottomWidth_m), topWidth_m and atDepth_m (parabola), diameter_m (circle). The report needs the geometry to
 * draw the section and its rating curve; a section it cannot rebuild is reported, never guessed.
 */
import { SECTION_FACTORIES, type SectionGeometry } from '../hydraulics/index.js';
import type { SectionResult } from '../analysis/model.js';
import type { UnitSystem } from '../units/units.js';
import { formatQuantity, formatSignificant } from './format.js';

export type SectionRebuild =
  | { readonly ok: true; readonly geometry: SectionGeometry }
  | { readonly ok: false; readonly reason: string };

/** The dimension keys each shape reads from SectionResult.dimensions. */
export const SECTION_DIMENSION_KEYS = {
  rectangle: ['bottomWidth_m'],
  trapezoid: ['bottomWidth_m', 'leftSideSlope_HV', 'rightSideSlope_HV'],
  triangle: ['leftSideSlope_HV', 'rightSideSlope_HV'],
  parabola: ['topWidth_m', 'atDepth_m'],
  circle: ['diameter_m'],
} as const;

/** The engine geometry of a section result, or why it cannot be built (missing or non-physical dimensions). */
export function sectionGeometryFromResult(section: SectionResult): SectionRebuild {
  const dimensions = section.dimensions;
  const read = (key: string): number | undefined => {
    const value = dimensions[key];
    return typeof value === 'number' && Number.isFinite(value) ? value : undefined;
  };
  const missing = (key: string): SectionRebuild => ({ ok: false, reason: `the ${section.shape} has no valid ${key}` });
  switch (section.shape) {
    case 'rectangle': {
      const bottomWidthM = read('bottomWidth_m');
      if (bottomWidthM === undefined || bottomWidthM <= 0) return missing('bottom width');
      return { ok: true, geometry: SECTION_FACTORIES.rectangle({ bottomWidthM }) };
    }
    case 'trapezoid': {
      const bottomWidthM = read('bottomWidth_m');
      const leftSideSlopeHV = read('leftSideSlope_HV');
      const rightSideSlopeHV = read('rightSideSlope_HV');
      if (bottomWidthM === undefined || bottomWidthM < 0) return missing('bottom width');
      if (leftSideSlopeHV === undefined || leftSideSlopeHV < 0) return missing('left side slope');
      if (rightSideSlopeHV === undefined || rightSideSlopeHV < 0) return missing('right side slope');
      if (bottomWidthM + leftSideSlopeHV + rightSideSlopeHV <= 0) return { ok: false, reason: 'the trapezoid has no width' };
      return { ok: true, geometry: SECTION_FACTORIES.trapezoid({ bottomWidthM, leftSideSlopeHV, rightSideSlopeHV }) };
    }
    case 'triangle': {
      const leftSideSlopeHV = read('leftSideSlope_HV');
      const rightSideSlopeHV = read('rightSideSlope_HV');
      if (leftSideSlopeHV === undefined || leftSideSlopeHV < 0) return missing('left side slope');
      if (rightSideSlopeHV === undefined || rightSideSlopeHV < 0) return missing('right side slope');
      if (leftSideSlopeHV + rightSideSlopeHV <= 0) return { ok: false, reason: 'the triangle has no width' };
      return { ok: true, geometry: SECTION_FACTORIES.triangle({ leftSideSlopeHV, rightSideSlopeHV }) };
    }
    case 'parabola': {
      const topWidthM = read('topWidth_m');
      const atDepthM = read('atDepth_m');
      if (topWidthM === undefined || topWidthM <= 0) return missing('top width');
      if (atDepthM === undefined || atDepthM <= 0) return missing('reference depth');
      return { ok: true, geometry: SECTION_FACTORIES.parabola({ topWidthM, atDepthM }) };
    }
    case 'circle': {
      const diameterM = read('diameter_m');
      if (diameterM === undefined || diameterM <= 0) return missing('diameter');
      return { ok: true, geometry: SECTION_FACTORIES.circle({ diameterM }) };
    }
    default:
      return { ok: false, reason: `unknown section shape '${String((section as { shape: unknown }).shape)}'` };
  }
}

/** A plain-words description of the section in display units, e.g. "trapezoid, bottom width 1.20 m, sides 3:1 left and 2:1 right (H:V)". */
export function describeSection(section: SectionResult, system: UnitSystem): string {
  const length = (key: string): string => formatQuantity(section.dimensions[key] ?? null, 'length', system);
  const ratio = (key: string): string => formatSignificant(section.dimensions[key] ?? null);
  switch (section.shape) {
    case 'rectangle':
      return `rectangle, width ${length('bottomWidth_m')}`;
    case 'trapezoid':
      return `trapezoid, bottom width ${length('bottomWidth_m')}, sides ${ratio('leftSideSlope_HV')}:1 left and ${ratio('rightSideSlope_HV')}:1 right (H:V)`;
    case 'triangle':
      return `V-shaped, sides ${ratio('leftSideSlope_HV')}:1 left and ${ratio('rightSideSlope_HV')}:1 right (H:V)`;
    case 'parabola':
      return `parabolic, top width ${length('topWidth_m')} at depth ${length('atDepth_m')}`;
    case 'circle':
      return `circular conduit, inside diameter ${length('diameter_m')}`;
    default:
      return String((section as { shape: unknown }).shape);
  }
}
