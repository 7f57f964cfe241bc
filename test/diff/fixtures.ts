/**
 * Hand-built design analyses for the comparison tests: trapezoidal reaches whose results are computed here,
 * independently of Runnel's engine and analysis, from Manning's equation (Chow 1959, Ch. 5-6) and the critical
 * flow condition Q^2 T = g A^3 (Chow 1959, Ch. 3-4), by plain bisection. Findings follow simple rules of the
 * trade (over-topping above the bank, freeboard below the required height, velocity or shear above the lining's
 * permissible value, Froude number in the near-critical band or above it), so a test can build "before" and
 * "after" of a change and know from physics which checks must move.
 */
import type {
  ChannelResult,
  CheckStatus,
  DesignAnalysis,
  Finding,
  FlowResult,
  ReachResult,
  ResolvedCriteria,
  Severity,
  SourceLocation,
  StateResult,
} from '../../language/analysis/model.js';

export const FOOT_M = 0.3048;
export const CFS_M3S = FOOT_M ** 3;
const GRAVITY = 9.80665;
const WATER_UNIT_WEIGHT = 9810;
/** Near-critical band (FHWA HEC-11 (1989) Sec. 3.2, secondary). */
const NEAR_CRITICAL = { low: 0.89, high: 1.13 };
/** Past this fraction over a lining limit the finding is an error (a test convention of these fixtures). */
const LIMIT_MARGIN = 0.2;

export interface LiningSpec {
  readonly name: string;
  readonly manningN: number;
  readonly maxVelocity_mps?: number | null;
  readonly maxShear_Pa?: number | null;
  readonly description?: string | null;
}

export interface SectionSpec {
  readonly name: string;
  readonly bottomWidth_m: number;
  /** Horizontal to vertical, both sides. */
  readonly sideSlope_HV: number;
  readonly bankDepth_m: number;
}

export interface FlowSpec {
  readonly name: string;
  readonly discharge_m3s: number;
  readonly description?: string | null;
}

export interface ReachSpec {
  readonly channel?: string;
  readonly name: string;
  readonly section: SectionSpec;
  readonly lining: LiningSpec;
  readonly slope: number;
  readonly length_m: number;
  readonly flows: readonly FlowSpec[];
  readonly requiredFreeboard_m?: number | null;
  readonly minVelocity_mps?: number | null;
}

function location(uri: string, line: number): SourceLocation {
  return { uri, range: { start: { line, character: 2 }, end: { line, character: 10 } } };
}

function bisect(f: (y: number) => number, low: number, high: number): number {
  let a = low;
  let b = high;
  for (let i = 0; i < 200; i++) {
    const mid = (a + b) / 2;
    if (f(mid) > 0) b = mid;
    else a = mid;
  }
  return (a + b) / 2;
}

const area = (s: SectionSpec, y: number): number => (s.bottomWidth_m + s.sideSlope_HV * y) * y;
const perimeter = (s: SectionSpec, y: number): number => s.bottomWidth_m + 2 * y * Math.sqrt(1 + s.sideSlope_HV ** 2);
const topWidth = (s: SectionSpec, y: number): number => s.bottomWidth_m + 2 * s.sideSlope_HV * y;
/** Manning's equation in SI (k = 1). */
export const manningDischarge = (s: SectionSpec, n: number, slope: number, y: number): number =>
  (area(s, y) * (area(s, y) / perimeter(s, y)) ** (2 / 3) * Math.sqrt(slope)) / n;

export function normalDepth(s: SectionSpec, n: number, slope: number, q: number): number {
  return bisect((y) => manningDischarge(s, n, slope, y) - q, 1e-9, 100);
}

export function criticalDepth(s: SectionSpec, q: number): number {
  return bisect((y) => GRAVITY * area(s, y) ** 3 - q * q * topWidth(s, y), 1e-9, 100);
}

function state(s: SectionSpec, y: number, q: number): StateResult {
  const a = area(s, y);
  const t = topWidth(s, y);
  const v = q / a;
  return {
    depth_m: y,
    area_m2: a,
    wettedPerimeter_m: perimeter(s, y),
    topWidth_m: t,
    hydraulicRadius_m: a / perimeter(s, y),
    hydraulicDepth_m: a / t,
    velocity_mps: v,
    froudeNumber: v / Math.sqrt((GRAVITY * a) / t),
    specificEnergy_m: y + (v * v) / (2 * GRAVITY),
    specificForce_m3: 0, // not compared
  };
}

function statusOf(findings: readonly Finding[]): CheckStatus {
  if (findings.some((f) => f.severity === 'error')) return 'fail';
  if (findings.some((f) => f.severity === 'warning')) return 'warning';
  if (findings.some((f) => f.severity === 'information')) return 'information';
  return 'pass';
}

function criteriaOf(spec: Pick<ReachSpec, 'requiredFreeboard_m' | 'minVelocity_mps'>): ResolvedCriteria {
  const required = spec.requiredFreeboard_m ?? null;
  return {
    freeboard: required === null ? null : { kind: 'fixed', height_m: required },
    avoidFroude: NEAR_CRITICAL,
    minVelocity_mps: spec.minVelocity_mps ?? null,
    limitMargin: LIMIT_MARGIN,
    origin: {},
  };
}

function reachResult(uri: string, spec: ReachSpec, line: number): ReachResult {
  const channel = spec.channel ?? 'main';
  const s = spec.section;
  const lining = { maxVelocity_mps: null, maxShear_Pa: null, description: null, ...spec.lining };
  const flows: FlowResult[] = spec.flows.map((flow) => {
    const yn = normalDepth(s, lining.manningN, spec.slope, flow.discharge_m3s);
    const yc = criticalDepth(s, flow.discharge_m3s);
    const normal = state(s, yn, flow.discharge_m3s);
    const maxShear = WATER_UNIT_WEIGHT * yn * spec.slope;
    const freeboard = s.bankDepth_m - yn;
    const findings: Finding[] = [];
    const add = (code: string, severity: Severity, message: string, data: Record<string, number> = {}): void => {
      findings.push({ code, severity, message, location: location(uri, line), channel, reach: spec.name, flow: flow.name, related: [], data });
    };
    const required = spec.requiredFreeboard_m ?? null;
    if (freeboard < 0) add('overtopping', 'error', `Over-topping at ${flow.name}.`);
    else if (required !== null && freeboard < required) add('freeboard-below-required', 'warning', `Freeboard at ${flow.name} is below the requirement.`);
    const overLimit = (value: number, limit: number | null): Severity | null =>
      limit === null || value <= limit ? null : value > limit * (1 + LIMIT_MARGIN) ? 'error' : 'warning';
    const velocitySeverity = overLimit(normal.velocity_mps, lining.maxVelocity_mps);
    if (velocitySeverity !== null) add('velocity-above-permissible', velocitySeverity, `Velocity at ${flow.name} is above the permissible value.`);
    const shearSeverity = overLimit(maxShear, lining.maxShear_Pa);
    if (shearSeverity !== null) add('shear-above-permissible', shearSeverity, `Shear at ${flow.name} | lining ${lining.name} is above the permissible value.`);
    if (normal.froudeNumber > NEAR_CRITICAL.high) add('supercritical-flow', 'warning', `Supercritical flow at ${flow.name}.`);
    else if (normal.froudeNumber >= NEAR_CRITICAL.low) add('near-critical-flow', 'warning', `Near-critical flow at ${flow.name}.`);
    const minimum = spec.minVelocity_mps ?? null;
    if (minimum !== null && normal.velocity_mps < minimum) add('velocity-below-self-cleansing', 'information', `Slow flow at ${flow.name}.`);
    return {
      flow: flow.name,
      description: flow.description ?? null,
      discharge_m3s: flow.discharge_m3s,
      flowLocation: location(uri, 1),
      normal,
      normalDepthNote: null,
      critical: state(s, yc, flow.discharge_m3s),
      criticalSlope: null,
      regime: normal.froudeNumber > 1 ? 'supercritical' : 'subcritical',
      slopeClass: yn > yc ? 'mild' : 'steep',
      maxShear_Pa: maxShear,
      averageShear_Pa: WATER_UNIT_WEIGHT * normal.hydraulicRadius_m * spec.slope,
      freeboard_m: freeboard,
      requiredFreeboard_m: required,
      status: statusOf(findings),
      findings,
    };
  });
  return {
    channel,
    name: spec.name,
    location: location(uri, line),
    nameLocation: location(uri, line),
    section: {
      name: s.name,
      shape: 'trapezoid',
      dimensions: { bottomWidth_m: s.bottomWidth_m, leftSideSlope_HV: s.sideSlope_HV, rightSideSlope_HV: s.sideSlope_HV },
      bankDepth_m: s.bankDepth_m,
      fullDepth_m: null,
      location: location(uri, 2),
    },
    lining: { ...lining, location: location(uri, 3) },
    slope: spec.slope,
    length_m: spec.length_m,
    upstreamInvert_m: null,
    downstreamInvert_m: null,
    bankfullCapacity_m3s: manningDischarge(s, lining.manningN, spec.slope, s.bankDepth_m),
    criteria: criteriaOf(spec),
    flows,
    status: statusOf(flows.flatMap((flow) => flow.findings)),
    provenance: { method: 'test fixture', assumptions: [], references: [] },
  };
}

export const TEST_CAUTION = 'Results are for design checking only; verify against local drainage criteria and licensed engineering review.';

/** A design of the given reaches, in document order (each reach on its own line for locations). */
export function designOf(title: string, reaches: readonly ReachSpec[], units: 'SI' | 'US' = 'US'): DesignAnalysis {
  const uri = `file:///project/${title}.runnel`;
  const results = reaches.map((reach, index) => reachResult(uri, reach, 10 + index * 6));
  const channelNames = [...new Set(results.map((reach) => reach.channel))];
  const channels: ChannelResult[] = channelNames.map((name) => ({
    name,
    location: location(uri, 9),
    outlet: { kind: 'free-fall' },
    reaches: results.filter((reach) => reach.channel === name),
  }));
  const flowSpecs = new Map<string, FlowSpec>();
  for (const reach of reaches) for (const flow of reach.flows) if (!flowSpecs.has(flow.name)) flowSpecs.set(flow.name, flow);
  return {
    uri,
    title,
    notes: [],
    displayUnits: units,
    channels,
    findings: channels.flatMap((channel) => channel.reaches.flatMap((reach) => reach.flows.flatMap((flow) => flow.findings))),
    caution: TEST_CAUTION,
    assumptions: [],
    provenance: { method: 'test fixture', assumptions: [], references: [] },
    version: 1,
    kind: 'design',
    displayUnitsOrigin: 'setting',
    flows: [...flowSpecs.values()].map((flow) => ({
      name: flow.name,
      description: flow.description ?? null,
      discharge_m3s: flow.discharge_m3s,
      location: location(uri, 1),
    })),
    criteria: criteriaOf(reaches[0] ?? {}),
    incompleteReaches: [],
  };
}
