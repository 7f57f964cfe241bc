import fc from 'fast-check';
import { computeChannelProfile, type ChannelProfileInput, type ProfileReachInput } from '../../../language/hydraulics/profile/index.js';
import { circleSection, parabolaSection, rectangleSection, trapezoidSection, triangleSection } from '../../../language/hydraulics/sections/index.js';
import type { SectionGeometry } from '../../../language/hydraulics/sections/section-geometry.js';
const sectionArbitrary: fc.Arbitrary<SectionGeometry> = fc.oneof(
  fc.double({ min: 0.3, max: 8, noNaN: true }).map((b) => rectangleSection({ bottomWidthM: b })),
  fc.tuple(fc.double({ min: 0.3, max: 6, noNaN: true }), fc.double({ min: 0, max: 4, noNaN: true })).map(([b, z]) =>
    trapezoidSection({ bottomWidthM: b, leftSideSlopeHV: z, rightSideSlopeHV: z }),
  ),
  fc.double({ min: 0.5, max: 5, noNaN: true }).map((z) => triangleSection({ leftSideSlopeHV: z, rightSideSlopeHV: z })),
  fc.double({ min: 1, max: 6, noNaN: true }).map((t) => parabolaSection({ topWidthM: t, atDepthM: 1 })),
  fc.double({ min: 1.5, max: 4, noNaN: true }).map((d) => circleSection({ diameterM: d })),
);

const reachArbitrary: fc.Arbitrary<ProfileReachInput> = fc.record({
  name: fc.constant('reach'),
  section: sectionArbitrary,
  manningN: fc.double({ min: 0.011, max: 0.05, noNaN: true }),
  bedSlope: fc.oneof(fc.constant(0), fc.double({ min: -0.003, max: -1e-4, noNaN: true }), fc.double({ min: 1e-4, max: 0.003, noNaN: true }), fc.double({ min: 0.01, max: 0.08, noNaN: true })),
  lengthM: fc.double({ min: 5, max: 800, noNaN: true }),
  downstreamInvertElevationM: fc.option(fc.double({ min: 0, max: 60, noNaN: true }), { nil: undefined }),
});

const channelArbitrary: fc.Arbitrary<ChannelProfileInput> = fc.record({
  reaches: fc.array(reachArbitrary, { minLength: 1, maxLength: 4 }).map((reaches) => reaches.map((reach, index) => ({ ...reach, name: `reach ${index + 1}` }))),
  dischargeM3s: fc.double({ min: 0.05, max: 10, noNaN: true }),
  outlet: fc.oneof(
    fc.constant({ kind: 'free-fall' } as const),
    fc.constant({ kind: 'normal-depth' } as const),
    fc.double({ min: -1, max: 65, noNaN: true }).map((elevationM) => ({ kind: 'water-level', elevationM }) as const),
  ),
  inlet: fc.oneof(
    fc.constant({ kind: 'critical-depth' } as const),
    fc.constant({ kind: 'normal-depth' } as const),
    fc.double({ min: 0.05, max: 1, noNaN: true }).map((depthM) => ({ kind: 'depth', depthM }) as const),
  ),
  junctionLossCoefficient: fc.oneof(fc.constant(0), fc.double({ min: 0, max: 0.5, noNaN: true })),
  kineticEnergyCoefficient: fc.oneof(fc.constant(1), fc.double({ min: 1, max: 1.3, noNaN: true })),
});


let worst = 0; let info: unknown; const reasons = new Map<string, number>();
for (const seed of [11, 12, 13]) for (const input of fc.sample(channelArbitrary, { numRuns: 3000, seed })) {
  const r = computeChannelProfile(input);
  if (!r.converged) { reasons.set(r.reason, (reasons.get(r.reason) ?? 0) + 1); continue; }
  reasons.set('ok', (reasons.get('ok') ?? 0) + 1);
  if (r.maximumEnergyResidualM > worst) {
    worst = r.maximumEnergyResidualM;
    const st = r.steps.find(s => s.energyResidualM !== null && Math.abs(s.energyResidualM) === worst)!;
    info = { kind: st.kind, st, a: r.points[st.upstreamPointIndex], b: r.points[st.downstreamPointIndex], shapes: input.reaches.map(x => x.section.description + ' n=' + x.manningN + ' S=' + x.bedSlope + ' L=' + x.lengthM + ' z=' + x.downstreamInvertElevationM), q: input.dischargeM3s, k: input.junctionLossCoefficient, alpha: input.kineticEnergyCoefficient, outlet: input.outlet, inlet: input.inlet };
  }
}
console.log(worst, reasons); console.dir(info, { depth: 5 });
