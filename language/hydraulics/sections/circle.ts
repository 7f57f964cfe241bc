/**
 * Circular conduit flowing partly full, diameter D (m). With theta = 2 acos(1 - 2y/D) the central angle of the
 * wetted arc (radians): A = D^2 (theta - sin theta) / 8, P = D theta / 2, T = D sin(theta / 2) (Chow 1959,
 * Table 2-1). The first moment about the surface is A (y - D/2) + D^3 sin^3(theta/2) / 12, from the centroid of a
 * circular segment at 4 r sin^3(theta/2) / (3 (theta - sin theta)) below the centre. Depths above D are clamped to D.
 */
import type { SectionGeometry } from './section-geometry.js';

export interface CircleDimensions {
  readonly diameterM: number;
}

export function circleSection({ diameterM }: CircleDimensions): SectionGeometry {
  const clamp = (y: number): number => Math.min(Math.max(y, 0), diameterM);
  const centralAngle = (y: number): number => 2 * Math.acos(1 - (2 * clamp(y)) / diameterM);
  return {
    shape: 'circle',
    description: `circular conduit, diameter ${Number(diameterM.toPrecision(4))} m`,
    fullDepthM: diameterM,
    areaM2: (y) => {
      const theta = centralAngle(y);
      return (diameterM * diameterM * (theta - Math.sin(theta))) / 8;
    },
    wettedPerimeterM: (y) => (diameterM * centralAngle(y)) / 2,
    topWidthM: (y) => {
      const yc = clamp(y);
      return 2 * Math.sqrt(yc * (diameterM - yc));
    },
    firstMomentM3: (y) => {
      const theta = centralAngle(y);
      const areaM2 = (diameterM * diameterM * (theta - Math.sin(theta))) / 8;
      return areaM2 * (clamp(y) - diameterM / 2) + (diameterM ** 3 * Math.sin(theta / 2) ** 3) / 12;
    },
    // dP/dy = (D/2) dtheta/dy = 2 / sin(theta/2) = D / sqrt(y (D - y)).
    wettedPerimeterSlope: (y) => {
      const yc = clamp(y);
      return diameterM / Math.sqrt(yc * (diameterM - yc));
    },
    // T = 2 sqrt(y (D - y)) so dT/dy = (D - 2y) / sqrt(y (D - y)).
    topWidthSlope: (y) => {
      const yc = clamp(y);
      return (diameterM - 2 * yc) / Math.sqrt(yc * (diameterM - yc));
    },
  };
}
