/**
 * "Size this section": the smallest standard size of a reach's section that passes every check for every design
 * flow, or why none does. Open rectangles and trapezoids are sized by bottom width, in 0.5 ft steps (US) or
 * 0.1 m steps (SI); circular conduits by nominal pipe diameter. Every other dimension, the lining, the slope and
 * the criteria in force stay as they are. Each candidate is judged with the engine directly, by the analysis'
 * uniform-flow rules (language/analysis/analyze-design.ts); a test keeps the two in step on every sample. The
 * analysis also judges over-topping and freeboard on the water-surface profile (the deeper of profile and normal
 * depth) and reports hydraulic jumps, so a size that fails these uniform-flow checks fails the analysis too: the
 * search here gives the candidates, in order, and the code action confirms the one it offers by re-analysing the
 * edited design (sizing-verification.ts). Pure: no LSP, no documents.
 */
import { FINDING_CODES } from '../../language/analysis/finding-messages.js';
import { usbrFreeboardCoefficientM, usbrFreeboardM } from '../../language/analysis/criteria-defaults.js';
import type { ReachResult, ResolvedCriteria } from '../../language/analysis/model.js';
import { sectionGeometryFromResult } from '../../language/report/section-from-result.js';
import {
  boundaryShear,
  classifyRegime,
  criticalSlope,
  hydraulicStateAt,
  solveNormalDepth,
  type SectionGeometry,
} from '../../language/hydraulics/index.js';
import { findUnit, type UnitSystem } from '../../language/units/units.js';
import { checkShortName } from './result-text.js';

/**
 * Bottom-width steps: 0.5 ft and 0.1 m, the increments channels are usually dimensioned in (common practice),
 * up to 400 steps (200 ft, 40 m); wider channels are outside what a quick fix should propose.
 */
export const BOTTOM_WIDTH_STEPS: Readonly<Record<UnitSystem, { readonly step: number; readonly decimals: number; readonly unit: string; readonly count: number }>> = {
  US: { step: 0.5, decimals: 1, unit: 'ft', count: 400 },
  SI: { step: 0.1, decimals: 1, unit: 'm', count: 400 },
};

/**
 * Common nominal sizes of concrete and plastic storm-drain pipe (common practice; the lists are from memory):
 * US inch sizes as in ASTM C76 reinforced concrete pipe, SI millimetre sizes as commonly manufactured.
 */
export const NOMINAL_PIPE_DIAMETERS: Readonly<Record<UnitSystem, { readonly unit: string; readonly sizes: readonly number[] }>> = {
  US: { unit: 'in', sizes: [12, 15, 18, 21, 24, 27, 30, 33, 36, 42, 48, 54, 60, 66, 72, 78, 84, 90, 96, 102, 108, 120, 132, 144] },
  SI: { unit: 'mm', sizes: [300, 375, 450, 525, 600, 675, 750, 825, 900, 1050, 1200, 1350, 1500, 1650, 1800, 1950, 2100, 2250, 2400, 2700, 3000] },
};

/** Everything that judges a reach, in SI: the analysis' results carry all of it. */
export interface SizingInputs {
  readonly shape: ReachResult['section']['shape'];
  readonly dimensions: Readonly<Record<string, number>>;
  /** Bank height of an open section, m, or null. */
  readonly bankDepthM: number | null;
  readonly manningN: number;
  readonly permissibleVelocityMps: number | null;
  readonly permissibleShearPa: number | null;
  readonly slope: number;
  readonly criteria: ResolvedCriteria;
  readonly flows: readonly { readonly name: string; readonly dischargeM3s: number }[];
}

/** A check that one flow does not pass, by its finding code. */
export interface FailedCheck {
  readonly code: string;
  readonly flow: string;
}

export type SizingResult =
  | {
      readonly ok: true;
      readonly property: 'bottom width' | 'diameter';
      /** The dimension key in SectionResult.dimensions. */
      readonly dimensionKey: 'bottomWidth_m' | 'diameter_m';
      /** How to write it, e.g. "3.5 ft" or "750 mm". */
      readonly text: string;
      readonly valueM: number;
    }
  | { readonly ok: false; readonly reason: string };

/** The sizing inputs of an analysed reach. */
export function sizingInputsOf(reach: ReachResult): SizingInputs {
  return {
    shape: reach.section.shape,
    dimensions: reach.section.dimensions,
    bankDepthM: reach.section.bankDepth_m,
    manningN: reach.lining.manningN,
    permissibleVelocityMps: reach.lining.maxVelocity_mps,
    permissibleShearPa: reach.lining.maxShear_Pa,
    slope: reach.slope,
    criteria: reach.criteria,
    flows: reach.flows.map((flow) => ({ name: flow.flow, dischargeM3s: flow.discharge_m3s })),
  };
}

/** A standard size, as written and in metres. */
export interface SizeCandidate {
  readonly text: string;
  readonly valueM: number;
}

type Candidate = SizeCandidate;

/** The candidate sizes of a shape in a unit system, smallest first; undefined with a reason when it has none. */
export function candidateSizes(shape: SizingInputs['shape'], system: UnitSystem): { property: 'bottom width' | 'diameter'; dimensionKey: 'bottomWidth_m' | 'diameter_m'; candidates: Candidate[] } | { reason: string } {
  if (shape === 'rectangle' || shape === 'trapezoid') {
    const grid = BOTTOM_WIDTH_STEPS[system];
    const factor = unitFactor(grid.unit);
    const candidates = Array.from({ length: grid.count }, (_, index) => {
      const number = plainNumber(((index + 1) * grid.step).toFixed(grid.decimals));
      return { text: `${number} ${grid.unit}`, valueM: Number(number) * factor };
    });
    return { property: 'bottom width', dimensionKey: 'bottomWidth_m', candidates };
  }
  if (shape === 'circle') {
    const list = NOMINAL_PIPE_DIAMETERS[system];
    const factor = unitFactor(list.unit);
    return { property: 'diameter', dimensionKey: 'diameter_m', candidates: list.sizes.map((size) => ({ text: `${size} ${list.unit}`, valueM: size * factor })) };
  }
  if (shape === 'triangle') return { reason: 'a V-shaped (triangle) section has no bottom width to size; change its side slopes or bank height instead' };
  return { reason: 'a parabolic section is set by its top width, which this action does not size' };
}

/** The smallest standard size passing every uniform-flow check for every flow, or why there is none. */
export function sizeSection(inputs: SizingInputs, system: UnitSystem): SizingResult {
  return sizesPassingUniformChecks(inputs, system).next().value;
}

/**
 * The standard sizes that pass every uniform-flow check, smallest first; when the list ends, why no (further) size
 * passes. Lazy: each size is judged only when asked for.
 */
export function* sizesPassingUniformChecks(inputs: SizingInputs, system: UnitSystem): Generator<Extract<SizingResult, { ok: true }>, Extract<SizingResult, { ok: false }>> {
  if (!(inputs.slope > 0)) return { ok: false, reason: 'the bed does not fall, so there is no normal depth to size the section by' };
  if (inputs.flows.length === 0) return { ok: false, reason: 'no design flow reaches this reach' };
  const grid = candidateSizes(inputs.shape, system);
  if ('reason' in grid) return { ok: false, reason: grid.reason };
  const failuresBySize: FailedCheck[][] = [];
  let passed = 0;
  for (const candidate of grid.candidates) {
    const failures = failedChecksWith(inputs, grid.dimensionKey, candidate.valueM);
    if (failures.length === 0) {
      passed++;
      yield { ok: true, property: grid.property, dimensionKey: grid.dimensionKey, text: candidate.text, valueM: candidate.valueM };
    } else {
      failuresBySize.push(failures);
    }
  }
  if (passed > 0) return { ok: false, reason: `no larger ${grid.property} up to ${grid.candidates[grid.candidates.length - 1]?.text ?? ''} passes the uniform-flow checks` };
  return { ok: false, reason: whyNoSizePasses(grid.property, grid.candidates, failuresBySize, inputs.shape === 'circle') };
}

/** The checks that fail with one dimension replaced by `valueM`. */
export function failedChecksWith(inputs: SizingInputs, dimensionKey: string, valueM: number): FailedCheck[] {
  const dimensions = { ...inputs.dimensions, [dimensionKey]: valueM };
  const rebuilt = sectionGeometryFromResult({ name: '', shape: inputs.shape, dimensions, bankDepth_m: inputs.bankDepthM, fullDepth_m: null, location: { uri: '', range: { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } } } });
  if (!rebuilt.ok) return [{ code: FINDING_CODES.depthSolveFailed, flow: '' }];
  return failedChecks(rebuilt.geometry, inputs);
}

/**
 * The checks each flow fails in a section, by the analysis' rules: depths that cannot be computed, no normal depth
 * on a bed that does not fall, conduit
 * capacity, over-topping, freeboard, the near-critical band, supercritical flow, the lining's permissible velocity
 * and shear (any exceedance), and the self-cleansing velocity.
 */
export function failedChecks(geometry: SectionGeometry, inputs: SizingInputs): FailedCheck[] {
  const failures: FailedCheck[] = [];
  const closed = geometry.fullDepthM !== undefined;
  const bankDepthM = closed ? null : inputs.bankDepthM;
  const { criteria } = inputs;
  for (const { name: flow, dischargeM3s } of inputs.flows) {
    const fail = (code: string): void => {
      failures.push({ code, flow });
    };
    const critical = criticalSlope(geometry, dischargeM3s, inputs.manningN);
    if (!critical.converged) fail(FINDING_CODES.depthSolveFailed);
    if (!(inputs.slope > 0)) {
      fail(FINDING_CODES.noNormalDepth);
      continue;
    }
    const normal = solveNormalDepth(geometry, { dischargeM3s, manningN: inputs.manningN, bedSlope: inputs.slope });
    if (!normal.converged) {
      fail(normal.reason === 'exceeds-capacity' ? FINDING_CODES.conduitOverCapacity : FINDING_CODES.depthSolveFailed);
      continue;
    }
    if (normal.branch === 'lower-of-two') fail(FINDING_CODES.conduitTwoDepthZone);
    const depthM = normal.depthM;
    const state = hydraulicStateAt(geometry, depthM, dischargeM3s);
    if (bankDepthM !== null && depthM > bankDepthM) {
      fail(FINDING_CODES.overtopping);
    } else if (bankDepthM !== null && criteria.freeboard !== null) {
      const requiredM =
        criteria.freeboard.kind === 'fixed'
          ? criteria.freeboard.height_m
          : usbrFreeboardM(criteria.freeboard.coefficientC_SI ?? usbrFreeboardCoefficientM(dischargeM3s), depthM);
      if (bankDepthM - depthM < requiredM) fail(FINDING_CODES.freeboardBelowRequired);
    }
    const froude = state.froudeNumber;
    if (froude >= criteria.avoidFroude.low && froude <= criteria.avoidFroude.high) fail(FINDING_CODES.nearCriticalFlow);
    else if (classifyRegime(froude) === 'supercritical') fail(FINDING_CODES.supercriticalFlow);
    if (inputs.permissibleVelocityMps !== null && state.velocityMs > inputs.permissibleVelocityMps) fail(FINDING_CODES.velocityAbovePermissible);
    if (inputs.permissibleShearPa !== null && boundaryShear(depthM, state.hydraulicRadiusM, inputs.slope).maximumPa > inputs.permissibleShearPa) {
      fail(FINDING_CODES.shearAbovePermissible);
    }
    if (criteria.minVelocity_mps !== null && state.velocityMs < criteria.minVelocity_mps) fail(FINDING_CODES.velocityBelowSelfCleansing);
  }
  return failures;
}

/** "no bottom width from 0.5 ft to 200 ft passes every check: supercritical (q10, q25) fails at every size". */
function whyNoSizePasses(property: string, candidates: readonly Candidate[], failuresBySize: readonly FailedCheck[][], conduit: boolean): string {
  const range = `from ${candidates[0]?.text ?? ''} to ${candidates[candidates.length - 1]?.text ?? ''}`;
  const codesAt = (failures: readonly FailedCheck[]): Set<string> => new Set(failures.map((failure) => failure.code));
  const everywhere = [...codesAt(failuresBySize[0] ?? [])].filter((code) => failuresBySize.every((failures) => codesAt(failures).has(code)));
  const describe = (failures: readonly FailedCheck[], codes: readonly string[]): string =>
    codes
      .map((code) => {
        const flows = [...new Set(failures.filter((failure) => failure.code === code && failure.flow !== '').map((failure) => failure.flow))];
        return `${checkShortName(code)}${flows.length === 0 ? '' : ` (${flows.join(', ')})`}`;
      })
      .join(', ');
  const head = `no ${property} ${range} passes every check`;
  if (everywhere.length > 0) return `${head}: ${describe(failuresBySize[failuresBySize.length - 1] ?? [], everywhere)} fails at every size`;
  const smallest = failuresBySize[0] ?? [];
  const largest = failuresBySize[failuresBySize.length - 1] ?? [];
  return `${head}: the ${conduit ? 'smaller pipes' : 'narrower widths'} fail ${describe(smallest, [...codesAt(smallest)])}; the ${conduit ? 'larger pipes' : 'wider ones'} fail ${describe(largest, [...codesAt(largest)])}`;
}

function unitFactor(symbol: string): number {
  const unit = findUnit(symbol);
  if (unit === undefined) throw new Error(`internal: unit '${symbol}' missing from the unit table`);
  return unit.toSI;
}

/** "1.0" -> "1", "0.5" -> "0.5". */
function plainNumber(text: string): string {
  return text.includes('.') ? text.replace(/0+$/, '').replace(/\.$/, '') : text;
}
