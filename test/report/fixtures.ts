/**
 * Test designs for the report, computed with the engine directly (never copied numbers): each reach is solved
 * with solveNormalDepth / solveCriticalDepth on a section built by the engine's own factories, and a few simple
 * checks (over-topping, freeboard, supercritical and near-critical flow, conduit capacity) stand in for the
 * analysis, which the report only displays. Scenarios are invented.
 */
import {
  SECTION_FACTORIES,
  boundaryShear,
  classifyRegime,
  classifySlope,
  criticalSlope,
  hydraulicStateAt,
  manningDischargeM3s,
  solveCriticalDepth,
  solveNormalDepth,
  type SectionGeometry,
} from '../../language/hydraulics/index.js';
import type {
  ChannelResult,
  CheckStatus,
  DesignAnalysis,
  Finding,
  FlowResult,
  ReachResult,
  SectionShapeName,
  SourceLocation,
  StateResult,
} from '../../language/analysis/model.js';
import { toDisplay, type UnitSystem } from '../../language/units/units.js';

export const FIXTURE_URI = 'file:///work/designs/northfield-road.runnel';

/** Near-critical band: FHWA HEC-11 (1989) Sec. 3.2 "transition zone" 0.89-1.13 (secondary). */
const NEAR_CRITICAL_LOW = 0.89;
const NEAR_CRITICAL_HIGH = 1.13;

export interface FlowSpec {
  readonly flow: string;
  readonly description: string | null;
  readonly discharge_m3s: number;
}

export interface ReachSpec {
  readonly channel: string;
  readonly name: string;
  readonly sectionName: string;
  readonly shape: SectionShapeName;
  readonly dimensions: Readonly<Record<string, number>>;
  readonly bankDepth_m: number | null;
  readonly liningName: string;
  readonly manningN: number;
  readonly slope: number;
  readonly length_m: number;
  readonly upstreamInvert_m?: number | null;
  readonly downstreamInvert_m?: number | null;
  readonly requiredFreeboard_m: number | null;
  readonly flows: readonly FlowSpec[];
  readonly line: number;
}

/** The engine geometry of a fixture section, built from the factories (independently of the report's rebuild). */
export function fixtureGeometry(shape: SectionShapeName, dimensions: Readonly<Record<string, number>>): SectionGeometry {
  const d = (key: string): number => {
    const value = dimensions[key];
    if (value === undefined) throw new Error(`fixture: missing ${key}`);
    return value;
  };
  switch (shape) {
    case 'rectangle':
      return SECTION_FACTORIES.rectangle({ bottomWidthM: d('bottomWidth_m') });
    case 'trapezoid':
      return SECTION_FACTORIES.trapezoid({ bottomWidthM: d('bottomWidth_m'), leftSideSlopeHV: d('leftSideSlope_HV'), rightSideSlopeHV: d('rightSideSlope_HV') });
    case 'triangle':
      return SECTION_FACTORIES.triangle({ leftSideSlopeHV: d('leftSideSlope_HV'), rightSideSlopeHV: d('rightSideSlope_HV') });
    case 'parabola':
      return SECTION_FACTORIES.parabola({ topWidthM: d('topWidth_m'), atDepthM: d('atDepth_m') });
    case 'circle':
      return SECTION_FACTORIES.circle({ diameterM: d('diameter_m') });
  }
}

function location(line: number, uri = FIXTURE_URI): SourceLocation {
  return { uri, range: { start: { line, character: 2 }, end: { line, character: 30 } } };
}

function state(geometry: SectionGeometry, depthM: number, dischargeM3s: number): StateResult {
  const s = hydraulicStateAt(geometry, depthM, dischargeM3s);
  return {
    depth_m: s.depthM,
    area_m2: s.areaM2,
    wettedPerimeter_m: s.wettedPerimeterM,
    topWidth_m: s.topWidthM,
    hydraulicRadius_m: s.hydraulicRadiusM,
    hydraulicDepth_m: s.hydraulicDepthM,
    velocity_mps: s.velocityMs,
    froudeNumber: s.froudeNumber,
    specificEnergy_m: s.specificEnergyM,
    specificForce_m3: s.specificForceM3,
  };
}

const STATUS_OF: Readonly<Record<Finding['severity'], CheckStatus>> = { error: 'fail', warning: 'warning', information: 'information' };
const STATUS_ORDER: readonly CheckStatus[] = ['pass', 'information', 'warning', 'fail'];

function worst(statuses: readonly CheckStatus[]): CheckStatus {
  return statuses.reduce<CheckStatus>((acc, status) => (STATUS_ORDER.indexOf(status) > STATUS_ORDER.indexOf(acc) ? status : acc), 'pass');
}

function lengthText(valueM: number, system: UnitSystem): string {
  const { value, unit } = toDisplay(valueM, 'length', system);
  return `${value.toPrecision(3)} ${unit}`;
}

export function buildReach(spec: ReachSpec, system: UnitSystem): ReachResult {
  const geometry = fixtureGeometry(spec.shape, spec.dimensions);
  const isConduit = spec.shape === 'circle';
  const crownM = isConduit ? (spec.dimensions['diameter_m'] ?? 0) : null;
  const flows: FlowResult[] = spec.flows.map((flowSpec) => {
    const normalSolve = solveNormalDepth(geometry, { dischargeM3s: flowSpec.discharge_m3s, manningN: spec.manningN, bedSlope: spec.slope });
    const criticalSolve = solveCriticalDepth(geometry, flowSpec.discharge_m3s);
    const normal = normalSolve.converged ? state(geometry, normalSolve.depthM, flowSpec.discharge_m3s) : null;
    const critical = criticalSolve.converged ? state(geometry, criticalSolve.depthM, flowSpec.discharge_m3s) : null;
    const criticalSlopeResult = criticalSlope(geometry, flowSpec.discharge_m3s, spec.manningN);
    const topM = isConduit ? crownM : spec.bankDepth_m;
    const freeboard = normal !== null && topM !== null ? topM - normal.depth_m : null;
    const findings: Finding[] = [];
    const base = { location: location(spec.line), channel: spec.channel, reach: spec.name, flow: flowSpec.flow, related: [] };
    if (!normalSolve.converged) {
      findings.push({ ...base, code: 'conduit-over-capacity', severity: 'error', message: normalSolve.message, data: {} });
    }
    if (normal !== null && spec.bankDepth_m !== null && normal.depth_m > spec.bankDepth_m) {
      findings.push({
        ...base,
        code: 'overtopping',
        severity: 'error',
        message: `Normal depth ${lengthText(normal.depth_m, system)} is above the bank height ${lengthText(spec.bankDepth_m, system)}: the channel over-tops.`,
        data: { depth_m: normal.depth_m, bank_m: spec.bankDepth_m },
      });
    } else if (freeboard !== null && spec.requiredFreeboard_m !== null && freeboard < spec.requiredFreeboard_m) {
      findings.push({
        ...base,
        code: 'freeboard-below-required',
        severity: 'warning',
        message: `Freeboard ${lengthText(freeboard, system)} is less than the required ${lengthText(spec.requiredFreeboard_m, system)}.`,
        data: { required_m: spec.requiredFreeboard_m, actual_m: freeboard },
      });
    }
    if (normal !== null && normal.froudeNumber >= NEAR_CRITICAL_LOW && normal.froudeNumber <= NEAR_CRITICAL_HIGH) {
      findings.push({ ...base, code: 'near-critical-flow', severity: 'warning', message: `Froude number ${normal.froudeNumber.toFixed(2)} is in the near-critical band.`, data: {} });
    } else if (normal !== null && normal.froudeNumber > 1) {
      findings.push({ ...base, code: 'supercritical-flow', severity: 'warning', message: `Flow is supercritical (Froude number ${normal.froudeNumber.toFixed(2)}).`, data: {} });
    }
    const shear = normal !== null ? boundaryShear(normal.depth_m, normal.hydraulicRadius_m, spec.slope) : null;
    return {
      flow: flowSpec.flow,
      description: flowSpec.description,
      discharge_m3s: flowSpec.discharge_m3s,
      flowLocation: location(3),
      normal,
      normalDepthNote: normalSolve.converged ? (normalSolve.branch === 'lower-of-two' ? 'Lower of two uniform-flow depths.' : null) : normalSolve.message,
      critical,
      criticalSlope: criticalSlopeResult.converged ? criticalSlopeResult.slope : null,
      regime: normal !== null ? classifyRegime(normal.froudeNumber) : null,
      slopeClass: classifySlope(spec.slope, normal?.depth_m, critical?.depth_m ?? 0),
      maxShear_Pa: shear?.maximumPa ?? null,
      averageShear_Pa: shear?.averagePa ?? null,
      freeboard_m: freeboard,
      requiredFreeboard_m: isConduit ? null : spec.requiredFreeboard_m,
      status: worst(findings.map((finding) => STATUS_OF[finding.severity])),
      findings,
    };
  });
  const capacityDepth = isConduit ? crownM : spec.bankDepth_m;
  return {
    channel: spec.channel,
    name: spec.name,
    location: location(spec.line),
    nameLocation: location(spec.line),
    section: {
      name: spec.sectionName,
      shape: spec.shape,
      dimensions: spec.dimensions,
      bankDepth_m: isConduit ? null : spec.bankDepth_m,
      fullDepth_m: crownM,
      location: location(spec.line - 1),
    },
    lining: { name: spec.liningName, manningN: spec.manningN, maxVelocity_mps: null, maxShear_Pa: null, description: null, location: location(1) },
    slope: spec.slope,
    length_m: spec.length_m,
    upstreamInvert_m: spec.upstreamInvert_m ?? null,
    downstreamInvert_m: spec.downstreamInvert_m ?? null,
    bankfullCapacity_m3s: capacityDepth !== null ? manningDischargeM3s(geometry, capacityDepth, spec.manningN, spec.slope) : null,
    criteria: {
      freeboard: spec.requiredFreeboard_m === null ? null : { kind: 'fixed', height_m: spec.requiredFreeboard_m },
      avoidFroude: { low: NEAR_CRITICAL_LOW, high: NEAR_CRITICAL_HIGH },
      minVelocity_mps: null,
      limitMargin: LIMIT_MARGIN,
      origin: { freeboard: 'design', avoidFroude: 'default' },
    },
    flows,
    status: worst(flows.map((flow) => flow.status)),
    provenance: PROVENANCE,
  };
}

/** How far past a permissible value a warning becomes an error (fixture value; the report only shows it). */
const LIMIT_MARGIN = 0.2;

const PROVENANCE = {
  method: "Manning's equation (SI, k = 1); normal and critical depth by safeguarded Newton iteration",
  assumptions: ['steady flow', 'uniform flow in a long prismatic reach', 'kinetic-energy coefficient alpha = 1'],
  references: ['Chow (1959) Open-Channel Hydraulics, Ch. 4 and 6'],
};

export const FIXTURE_CAUTION =
  'Results are for design checking. They rest on the assumptions stated in this report; verify against local drainage criteria and have the design reviewed by a licensed engineer.';

export function buildAnalysis(options: {
  title: string;
  system: UnitSystem;
  channels: readonly { name: string; outlet: ChannelResult['outlet']; reaches: readonly ReachSpec[] }[];
  notes?: readonly string[];
  incompleteReaches?: DesignAnalysis['incompleteReaches'];
}): DesignAnalysis {
  const channels: ChannelResult[] = options.channels.map((channel, index) => ({
    name: channel.name,
    location: location(10 + index),
    outlet: channel.outlet,
    reaches: channel.reaches.map((spec) => buildReach(spec, options.system)),
  }));
  const flowNames = new Map<string, string | null>();
  for (const channel of options.channels) for (const reach of channel.reaches) for (const flow of reach.flows) if (!flowNames.has(flow.flow)) flowNames.set(flow.flow, flow.description);
  return {
    uri: FIXTURE_URI,
    version: 1,
    kind: 'design',
    displayUnitsOrigin: 'setting',
    flows: [...flowNames].map(([name, description]) => ({ name, description, discharge_m3s: null, location: location(3) })),
    criteria: {
      freeboard: null,
      avoidFroude: { low: NEAR_CRITICAL_LOW, high: NEAR_CRITICAL_HIGH },
      minVelocity_mps: null,
      limitMargin: LIMIT_MARGIN,
      origin: {},
    },
    incompleteReaches: options.incompleteReaches ?? [],
    title: options.title,
    notes: options.notes ?? [],
    displayUnits: options.system,
    channels,
    findings: channels.flatMap((channel) => channel.reaches.flatMap((reach) => reach.flows.flatMap((flow) => flow.findings))),
    caution: FIXTURE_CAUTION,
    assumptions: ['Steady flow; each reach long and prismatic enough for uniform flow.', 'Water surfaces drawn at normal depth.'],
    provenance: PROVENANCE,
  };
}

const STORM_FLOWS: readonly FlowSpec[] = [
  { flow: 'q10', description: '10-year storm', discharge_m3s: 0.45 },
  { flow: 'q100', description: '100-year storm', discharge_m3s: 0.95 },
];

/** An SI design: a roadside ditch of three shapes ending in a free fall, and a culvert line with a V-ditch. */
export function siDesign(names: { title?: string; channel?: string; reach?: string; flow?: string; note?: string } = {}): DesignAnalysis {
  const flows = names.flow === undefined ? STORM_FLOWS : STORM_FLOWS.map((flow, index) => (index === 1 ? { ...flow, flow: names.flow ?? flow.flow, description: names.flow ?? null } : flow));
  const eastDitch = names.channel ?? 'east-ditch';
  return buildAnalysis({
    title: names.title ?? 'Northfield Road drainage, stage 2',
    system: 'SI',
    notes: [names.note ?? 'Invented scenario for tests: a roadside ditch draining to a culvert line.'],
    channels: [
      {
        name: eastDitch,
        outlet: { kind: 'free-fall' },
        reaches: [
          {
            channel: eastDitch,
            name: names.reach ?? 'upper-swale',
            sectionName: 'grass-swale',
            shape: 'parabola',
            dimensions: { topWidth_m: 2.4, atDepth_m: 0.45 },
            bankDepth_m: 0.5,
            liningName: 'short-grass',
            manningN: 0.035,
            slope: 0.008,
            length_m: 120,
            upstreamInvert_m: 52.4,
            requiredFreeboard_m: 0.15,
            flows,
            line: 20,
          },
          {
            channel: eastDitch,
            name: 'mid-ditch',
            sectionName: 'lined-trapezoid',
            shape: 'trapezoid',
            dimensions: { bottomWidth_m: 0.9, leftSideSlope_HV: 3, rightSideSlope_HV: 2 },
            bankDepth_m: 0.75,
            liningName: 'earth-weathered',
            manningN: 0.022,
            slope: 0.005,
            length_m: 180,
            requiredFreeboard_m: 0.15,
            flows,
            line: 28,
          },
          {
            channel: eastDitch,
            name: 'outfall-chute',
            sectionName: 'concrete-flume',
            shape: 'rectangle',
            dimensions: { bottomWidth_m: 0.8 },
            bankDepth_m: 0.45,
            liningName: 'concrete-float',
            manningN: 0.015,
            slope: 0.04,
            length_m: 40,
            requiredFreeboard_m: 0.15,
            flows,
            line: 36,
          },
        ],
      },
      {
        name: 'culvert-line',
        outlet: { kind: 'water-level', elevation_m: 49.35 },
        reaches: [
          {
            channel: 'culvert-line',
            name: 'road-culvert',
            sectionName: 'pipe-600',
            shape: 'circle',
            dimensions: { diameter_m: 0.6 },
            bankDepth_m: null,
            liningName: 'concrete-pipe',
            manningN: 0.013,
            slope: 0.01,
            length_m: 60,
            upstreamInvert_m: 50.5,
            requiredFreeboard_m: null,
            flows: [
              { flow: 'q10', description: '10-year storm', discharge_m3s: 0.35 },
              { flow: 'q100', description: '100-year storm', discharge_m3s: 0.7 },
            ],
            line: 44,
          },
          {
            channel: 'culvert-line',
            name: 'toe-ditch',
            sectionName: 'v-ditch',
            shape: 'triangle',
            dimensions: { leftSideSlope_HV: 4, rightSideSlope_HV: 2 },
            bankDepth_m: 0.55,
            liningName: 'short-grass',
            manningN: 0.035,
            slope: 0.01,
            length_m: 90,
            requiredFreeboard_m: 0.15,
            flows: [
              { flow: 'q10', description: '10-year storm', discharge_m3s: 0.35 },
              { flow: 'q100', description: '100-year storm', discharge_m3s: 0.6 },
            ],
            line: 52,
          },
        ],
      },
    ],
  });
}

/**
 * Chow (1959) Ch. 6 uniform-flow example (Example 6-2 as recalled; REFERENCES.md N1, from memory, recomputes
 * exactly): trapezoid b = 20 ft, z = 2 (H:V), n = 0.025, S = 0.0016, Q = 400 cfs; yn = 3.36 ft; critical depth
 * on the same channel 2.15 ft (C1, from memory). Shown in US units. Bank height and length are invented.
 */
export function chowTrapezoidDesign(): DesignAnalysis {
  const FOOT_M = 0.3048;
  const CUBIC_FOOT_M3 = FOOT_M ** 3;
  return buildAnalysis({
    title: 'Chow trapezoid, 400 cfs',
    system: 'US',
    channels: [
      {
        name: 'main-canal',
        outlet: { kind: 'normal-depth' },
        reaches: [
          {
            channel: 'main-canal',
            name: 'canal',
            sectionName: 'canal-section',
            shape: 'trapezoid',
            dimensions: { bottomWidth_m: 20 * FOOT_M, leftSideSlope_HV: 2, rightSideSlope_HV: 2 },
            bankDepth_m: 5 * FOOT_M,
            liningName: 'earth',
            manningN: 0.025,
            slope: 0.0016,
            length_m: 1000 * FOOT_M,
            requiredFreeboard_m: 1 * FOOT_M,
            flows: [{ flow: 'design', description: null, discharge_m3s: 400 * CUBIC_FOOT_M3 }],
            line: 5,
          },
        ],
      },
    ],
  });
}

/** Names, titles and notes that try to break out of HTML, attributes, CSS and Markdown. */
export const HOSTILE_NAMES = {
  title: 'Ditch <script>window.__reportScriptRan = 1</script> & "quotes" \'single\'',
  channel: '</style><script>window.__reportScriptRan = 2</script>',
  reach: '"><img src=x onerror="window.__reportScriptRan = 3">',
  flow: "q|100 <b>bold</b> & 'x' `code` *em* [link](javascript:alert(1))",
  note: '<iframe src="https://example.invalid/"></iframe> </title> <!-- comment --> ]]>',
} as const;
