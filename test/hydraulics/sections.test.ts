/**
 * Cross-section geometry against closed forms (Chow 1959, Table 2-1, as reproduced in any open-channel text;
 * common practice) and against numerical integration of the shape's own definition, written here independently of
 * the engine (area = integral of top width, first moment = integral of top width times depth below the surface,
 * perimeter = arc length of the bed).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  circleSection,
  hydraulicDepthM,
  hydraulicRadiusM,
  newHydraulicTerms,
  parabolaSection,
  rectangleSection,
  SECTION_FACTORIES,
  TERM_AREA,
  TERM_TOP_WIDTH,
  TERM_TOP_WIDTH_SLOPE,
  TERM_WETTED_PERIMETER,
  TERM_WETTED_PERIMETER_SLOPE,
  trapezoidSection,
  triangleSection,
  type SectionGeometry,
} from '../../language/hydraulics/index.js';
import { expectRelative, integrate } from './engineering-check.js';

const TABLE_2_1 = 'Chow (1959) Open-Channel Hydraulics, Table 2-1, geometric elements (common practice)';
const INTEGRATION = 'numerical integration of the shape definition (derived)';

describe('closed-form geometry (Table 2-1 elements)', () => {
  const cases: { id: string; section: SectionGeometry; depthM: number; area: number; perimeter: number; top: number; firstMoment: number }[] = [
    // Rectangle b = 3: A = 3y, P = 3 + 2y, T = 3, A ybar = 3 y^2 / 2.
    { id: 'rect-1', section: rectangleSection({ bottomWidthM: 3 }), depthM: 1.2, area: 3.6, perimeter: 5.4, top: 3, firstMoment: 2.16 },
    // Trapezoid b = 2, zL = 1, zR = 3, y = 1: A = 2 + 2 = 4, P = 2 + sqrt2 + sqrt10, T = 6, M = 1 + 4/6.
    {
      id: 'trap-1',
      section: trapezoidSection({ bottomWidthM: 2, leftSideSlopeHV: 1, rightSideSlopeHV: 3 }),
      depthM: 1,
      area: 4,
      perimeter: 2 + Math.SQRT2 + Math.sqrt(10),
      top: 6,
      firstMoment: 1 + 4 / 6,
    },
    // Triangle z = 2 each side, y = 0.5: A = z y^2 = 0.5, P = 2 y sqrt(5), T = 2, M = A y / 3.
    {
      id: 'tri-1',
      section: triangleSection({ leftSideSlopeHV: 2, rightSideSlopeHV: 2 }),
      depthM: 0.5,
      area: 0.5,
      perimeter: Math.sqrt(5),
      top: 2,
      firstMoment: 0.5 / 6,
    },
    // Half-full circle D = 2: A = pi/2, P = pi, T = 2, centroid 4r/(3 pi) below the centre: M = (pi/2)(4/(3 pi)) = 2/3.
    { id: 'circ-half', section: circleSection({ diameterM: 2 }), depthM: 1, area: Math.PI / 2, perimeter: Math.PI, top: 2, firstMoment: 2 / 3 },
    // Full circle D = 2: A = pi, P = 2 pi, T = 0, M = A r = pi.
    { id: 'circ-full', section: circleSection({ diameterM: 2 }), depthM: 2, area: Math.PI, perimeter: 2 * Math.PI, top: 0, firstMoment: Math.PI },
  ];
  it.each(cases)('$id: A, P, T and first moment match the closed form', ({ id, section, depthM, area, perimeter, top, firstMoment }) => {
    const input = `${section.description}, y = ${depthM} m`;
    expectRelative({ id, source: TABLE_2_1, input, value: section.areaM2(depthM), expected: area, relativeTolerance: 1e-13, unit: 'm2' });
    expectRelative({ id, source: TABLE_2_1, input, value: section.wettedPerimeterM(depthM), expected: perimeter, relativeTolerance: 1e-13, unit: 'm' });
    expect(Math.abs(section.topWidthM(depthM) - top), `[${id}] top width at ${input}`).toBeLessThanOrEqual(1e-12);
    expectRelative({ id, source: TABLE_2_1, input, value: section.firstMomentM3(depthM), expected: firstMoment, relativeTolerance: 1e-12, unit: 'm3' });
  });

  it('hydraulic radius and hydraulic depth are A/P and A/T', () => {
    const section = trapezoidSection({ bottomWidthM: 2, leftSideSlopeHV: 1, rightSideSlopeHV: 3 });
    expectRelative({ id: 'R', source: TABLE_2_1, input: 'trapezoid b = 2 m, 1:1 and 3:1, y = 1 m', value: hydraulicRadiusM(section, 1), expected: 4 / (2 + Math.SQRT2 + Math.sqrt(10)), relativeTolerance: 1e-14, unit: 'm' });
    expectRelative({ id: 'D', source: TABLE_2_1, input: 'same', value: hydraulicDepthM(section, 1), expected: 4 / 6, relativeTolerance: 1e-14, unit: 'm' });
    expect(hydraulicRadiusM(section, 0)).toBe(0);
  });

  it('circle with Chow\'s acos form of the central angle at moderate depths', () => {
    // theta = 2 acos(1 - 2y/D), A = D^2 (theta - sin theta)/8, P = D theta / 2 (Table 2-1).
    const diameterM = 1.5;
    const section = circleSection({ diameterM });
    for (const ratio of [0.1, 0.25, 0.4, 0.6, 0.75, 0.9, 0.97]) {
      const y = ratio * diameterM;
      const theta = 2 * Math.acos(1 - 2 * ratio);
      const input = `D = ${diameterM} m, y/D = ${ratio}`;
      expectRelative({ id: 'circ-acos', source: TABLE_2_1, input, value: section.areaM2(y), expected: (diameterM ** 2 * (theta - Math.sin(theta))) / 8, relativeTolerance: 1e-12, unit: 'm2' });
      expectRelative({ id: 'circ-acos', source: TABLE_2_1, input, value: section.wettedPerimeterM(y), expected: (diameterM * theta) / 2, relativeTolerance: 1e-12, unit: 'm' });
      expectRelative({ id: 'circ-acos', source: TABLE_2_1, input, value: section.topWidthM(y), expected: diameterM * Math.sin(theta / 2), relativeTolerance: 1e-12, unit: 'm' });
    }
  });
});

describe('parabola against numerical integration of x = a sqrt(y)', () => {
  // Swale with top width 4 m at 0.5 m depth: half-width a sqrt(y), a = Tr / (2 sqrt(yr)).
  const referenceTopWidthM = 4;
  const referenceDepthM = 0.5;
  const section = parabolaSection({ topWidthM: referenceTopWidthM, atDepthM: referenceDepthM });
  const a = referenceTopWidthM / (2 * Math.sqrt(referenceDepthM));
  // Substitute eta = t^2 so the sqrt at the vertex becomes smooth: d eta = 2 t dt, T(eta) = 2 a t.
  const area = (y: number): number => integrate((t) => 2 * a * t * 2 * t, 0, Math.sqrt(y));
  const firstMoment = (y: number): number => integrate((t) => 2 * a * t * (y - t * t) * 2 * t, 0, Math.sqrt(y));
  // Bed y = x^2 / a^2: arc length 2 int_0^X sqrt(1 + (2x/a^2)^2) dx, X = a sqrt(y).
  const perimeter = (y: number): number => 2 * integrate((x) => Math.sqrt(1 + ((2 * x) / (a * a)) ** 2), 0, a * Math.sqrt(y));
  it.each([0.01, 0.2, 0.5, 1.3, 4])('y = %f m: A, P, first moment and T agree with integration', (y) => {
    const input = `parabola, T = ${referenceTopWidthM} m at ${referenceDepthM} m, y = ${y} m`;
    expectRelative({ id: 'para-A', source: INTEGRATION, input, value: section.areaM2(y), expected: area(y), relativeTolerance: 1e-11, unit: 'm2' });
    expectRelative({ id: 'para-P', source: INTEGRATION, input, value: section.wettedPerimeterM(y), expected: perimeter(y), relativeTolerance: 1e-11, unit: 'm' });
    expectRelative({ id: 'para-M', source: INTEGRATION, input, value: section.firstMomentM3(y), expected: firstMoment(y), relativeTolerance: 1e-11, unit: 'm3' });
    expectRelative({ id: 'para-T', source: 'definition (derived)', input, value: section.topWidthM(y), expected: 2 * a * Math.sqrt(y), relativeTolerance: 1e-14, unit: 'm' });
  });
  it('matches the shallow-section series P = T + 8y^2/(3T) where Table 2-1 says it applies (4y/T small)', () => {
    const y = 0.02; // T = 0.8 m, 4y/T = 0.1
    const topWidth = 2 * a * Math.sqrt(y);
    // The series is truncated: its first neglected term is of order T (4y/T)^4 ~ 1e-4 T.
    expectRelative({ id: 'para-series', source: TABLE_2_1, input: `y = ${y} m`, value: section.wettedPerimeterM(y), expected: topWidth + (8 * y * y) / (3 * topWidth), relativeTolerance: 2e-4, unit: 'm' });
  });
});

describe('circle against numerical integration (first moment, area) at all depths', () => {
  // Parametrise by the angle phi of the wetted arc measured from the invert: eta = (D/2)(1 - cos phi),
  // T = D sin phi, d eta = (D/2) sin phi d phi; depth below the surface y - eta = D (sin^2(phiY/2) - sin^2(phi/2)),
  // written as the product sin((phiY + phi)/2) sin((phiY - phi)/2) so that shallow depths lose no digits.
  const diameterM = 0.9;
  const section = circleSection({ diameterM });
  const arcAngle = (y: number): number => 2 * Math.asin(Math.sqrt(y / diameterM));
  const area = (y: number): number => integrate((phi) => diameterM * Math.sin(phi) * (diameterM / 2) * Math.sin(phi), 0, arcAngle(y), 400);
  const firstMoment = (y: number): number => {
    const phiY = arcAngle(y);
    return integrate(
      (phi) => {
        const below = diameterM * Math.sin((phiY + phi) / 2) * Math.sin((phiY - phi) / 2);
        return diameterM * Math.sin(phi) * below * (diameterM / 2) * Math.sin(phi);
      },
      0,
      phiY,
      400,
    );
  };
  it.each([1e-9, 1e-6, 1e-3, 0.015, 0.02, 0.025, 0.2, 0.5, 0.81, 0.938, 0.999999])('y/D = %f', (ratio) => {
    const y = ratio * diameterM;
    const input = `circle D = ${diameterM} m, y/D = ${ratio}`;
    expectRelative({ id: 'circ-A', source: INTEGRATION, input, value: section.areaM2(y), expected: area(y), relativeTolerance: 1e-11, unit: 'm2' });
    expectRelative({ id: 'circ-M', source: INTEGRATION, input, value: section.firstMomentM3(y), expected: firstMoment(y), relativeTolerance: 1e-11, unit: 'm3' });
  });
  it('clamps depths outside [0, D] and keeps the full-pipe values above the crown', () => {
    expect(section.areaM2(2 * diameterM)).toBe(section.areaM2(diameterM));
    expect(section.areaM2(-1)).toBe(0);
    expect(section.topWidthM(1.5 * diameterM)).toBe(0);
  });
});

describe('derivatives dP/dy and dT/dy against central differences', () => {
  const shapes: SectionGeometry[] = [
    rectangleSection({ bottomWidthM: 2 }),
    trapezoidSection({ bottomWidthM: 1.5, leftSideSlopeHV: 2, rightSideSlopeHV: 3.5 }),
    triangleSection({ leftSideSlopeHV: 0, rightSideSlopeHV: 4 }),
    parabolaSection({ topWidthM: 3, atDepthM: 0.4 }),
    circleSection({ diameterM: 1.2 }),
  ];
  it.each(shapes.map((section) => ({ section, name: section.description })))('$name', ({ section }) => {
    for (const y of [0.05, 0.3, 0.6, 1.1]) {
      const h = 1e-6 * y;
      const perimeterSlope = (section.wettedPerimeterM(y + h) - section.wettedPerimeterM(y - h)) / (2 * h);
      const topWidthSlope = (section.topWidthM(y + h) - section.topWidthM(y - h)) / (2 * h);
      const areaSlope = (section.areaM2(y + h) - section.areaM2(y - h)) / (2 * h);
      const input = `${section.description}, y = ${y} m`;
      expectRelative({ id: 'dP/dy', source: 'central difference (derived)', input, value: section.wettedPerimeterSlope(y), expected: perimeterSlope, relativeTolerance: 1e-6, unit: '-' });
      expect(Math.abs(section.topWidthSlope(y) - topWidthSlope), `dT/dy at ${input}`).toBeLessThanOrEqual(1e-6 * (1 + Math.abs(topWidthSlope)));
      expectRelative({ id: 'T = dA/dy', source: 'definition of top width (derived)', input, value: section.topWidthM(y), expected: areaSlope, relativeTolerance: 1e-6, unit: 'm' });
    }
  });
});

describe('the terms filled in one call are the five functions, bit for bit', () => {
  // The solvers and the standard step read A, P, T, dP/dy and dT/dy through fillHydraulicTerms; every other reader
  // calls the functions one by one. Both must give the same numbers, or a profile would disagree with its own checks.
  const sections = fc.oneof(
    fc.record({ bottomWidthM: fc.double({ min: 0.1, max: 20, noNaN: true }) }).map(rectangleSection),
    fc
      .record({ bottomWidthM: fc.double({ min: 0, max: 20, noNaN: true }), leftSideSlopeHV: fc.double({ min: 0, max: 6, noNaN: true }), rightSideSlopeHV: fc.double({ min: 0.1, max: 6, noNaN: true }) })
      .map(trapezoidSection),
    fc.record({ leftSideSlopeHV: fc.double({ min: 0, max: 6, noNaN: true }), rightSideSlopeHV: fc.double({ min: 0.1, max: 6, noNaN: true }) }).map(triangleSection),
    fc.record({ topWidthM: fc.double({ min: 0.5, max: 20, noNaN: true }), atDepthM: fc.double({ min: 0.1, max: 3, noNaN: true }) }).map(parabolaSection),
    fc.record({ diameterM: fc.double({ min: 0.1, max: 5, noNaN: true }) }).map(circleSection),
  );
  it('for every shape at depths from dry to above a crown', () => {
    const terms = newHydraulicTerms();
    fc.assert(
      fc.property(sections, fc.double({ min: -1, max: 10, noNaN: true }), (section, depthM) => {
        section.fillHydraulicTerms(depthM, terms);
        expect(terms[TERM_AREA]).toBe(section.areaM2(depthM));
        expect(terms[TERM_WETTED_PERIMETER]).toBe(section.wettedPerimeterM(depthM));
        expect(terms[TERM_TOP_WIDTH]).toBe(section.topWidthM(depthM));
        expect(terms[TERM_WETTED_PERIMETER_SLOPE]).toBe(section.wettedPerimeterSlope(depthM));
        expect(terms[TERM_TOP_WIDTH_SLOPE]).toBe(section.topWidthSlope(depthM));
      }),
      { numRuns: 5000 },
    );
  });
});

describe('dimensions that cannot describe a channel are named, not computed with', () => {
  const cases: { id: string; section: SectionGeometry; mentions: string }[] = [
    { id: 'rect-zero', section: rectangleSection({ bottomWidthM: 0 }), mentions: 'bottom width' },
    { id: 'rect-nan', section: rectangleSection({ bottomWidthM: Number.NaN }), mentions: 'bottom width' },
    { id: 'trap-negative-side', section: trapezoidSection({ bottomWidthM: 1, leftSideSlopeHV: -0.5, rightSideSlopeHV: 2 }), mentions: 'left side slope' },
    { id: 'trap-no-bottom-no-sides', section: trapezoidSection({ bottomWidthM: 0, leftSideSlopeHV: 0, rightSideSlopeHV: 0 }), mentions: 'bottom width' },
    { id: 'tri-flat', section: triangleSection({ leftSideSlopeHV: 0, rightSideSlopeHV: 0 }), mentions: 'sloping side' },
    { id: 'tri-infinite', section: triangleSection({ leftSideSlopeHV: Number.POSITIVE_INFINITY, rightSideSlopeHV: 1 }), mentions: 'left side slope' },
    { id: 'para-zero-depth', section: parabolaSection({ topWidthM: 2, atDepthM: 0 }), mentions: 'reference depth' },
    { id: 'circ-negative', section: circleSection({ diameterM: -0.3 }), mentions: 'diameter' },
  ];
  it.each(cases)('$id', ({ section, mentions }) => {
    expect(section.dimensionProblem).toContain(mentions);
  });
  it('valid shapes, including a trapezoid with no bottom (a V) or vertical sides (a rectangle), have no problem', () => {
    expect(trapezoidSection({ bottomWidthM: 0, leftSideSlopeHV: 2, rightSideSlopeHV: 2 }).dimensionProblem).toBeUndefined();
    expect(trapezoidSection({ bottomWidthM: 2, leftSideSlopeHV: 0, rightSideSlopeHV: 0 }).dimensionProblem).toBeUndefined();
    expect(SECTION_FACTORIES.circle({ diameterM: 0.6 }).dimensionProblem).toBeUndefined();
  });
});
