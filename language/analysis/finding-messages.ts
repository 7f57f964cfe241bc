/**
 * The findings of the analysis: each code, its severity rule and its message, in one place. Messages give numbers
 * with units in the design's display units and name the flow they concern.
 */
import { describeJumpType } from '../hydraulics/index.js';
import type { UnitSystem } from '../units/units.js';
import { formatPercent, formatQuantity, formatRatio } from './format-quantity.js';
import { CRITERION_FROM_SETTING, DEFAULT_NEAR_CRITICAL_FROUDE_BAND } from './criteria-defaults.js';
import type { CriterionOrigin } from './model.js';

/** Stable finding codes (the contract in model.ts lists them). */
export const FINDING_CODES = {
  overtopping: 'overtopping',
  freeboardBelowRequired: 'freeboard-below-required',
  supercriticalFlow: 'supercritical-flow',
  nearCriticalFlow: 'near-critical-flow',
  velocityAbovePermissible: 'velocity-above-permissible',
  shearAbovePermissible: 'shear-above-permissible',
  velocityBelowSelfCleansing: 'velocity-below-self-cleansing',
  conduitOverCapacity: 'conduit-over-capacity',
  conduitTwoDepthZone: 'conduit-two-depth-zone',
  noNormalDepth: 'no-normal-depth',
  depthSolveFailed: 'depth-solve-failed',
  hydraulicJump: 'hydraulic-jump',
  hydraulicJumpSweptOut: 'hydraulic-jump-swept-out',
  hydraulicJumpLiningExceeded: 'hydraulic-jump-lining-exceeded',
  conduitSurcharged: 'conduit-surcharged',
  profileNotComputed: 'profile-not-computed',
} as const;

export type FindingCode = (typeof FINDING_CODES)[keyof typeof FINDING_CODES];

/** Formats SI values in one display system. */
export class MessageFormatter {
  constructor(readonly system: UnitSystem) {}
  length(valueM: number): string {
    return formatQuantity(valueM, 'length', this.system);
  }
  discharge(valueM3s: number): string {
    return formatQuantity(valueM3s, 'discharge', this.system);
  }
  velocity(valueMps: number): string {
    return formatQuantity(valueMps, 'velocity', this.system);
  }
  shear(valuePa: number): string {
    return formatQuantity(valuePa, 'shear', this.system);
  }
  slope(value: number): string {
    return formatQuantity(value, 'slope', this.system);
  }
  /** A place along a channel: "station 1310 ft" (distance from the channel's upstream end). */
  station(valueM: number): string {
    return `station ${formatQuantity(valueM, 'length', this.system)}`;
  }
}

/** Where a jump stands, for the jump findings. */
export interface JumpWords {
  readonly flow: string;
  readonly reach: string;
  readonly stationM: number;
  readonly placement: 'within-reach' | 'at-junction' | 'beyond-outlet';
  readonly upstreamDepthM: number;
  readonly downstreamDepthM: number;
  readonly froude: number;
  readonly jumpType: Parameters<typeof describeJumpType>[0];
  readonly energyLossM: number;
  /** For a jump at a junction: true when it stands at the head of its reach (the foot of a drop above), false at the reach's end. */
  readonly atReachHead: boolean;
}

function jumpPlace(f: MessageFormatter, p: JumpWords): string {
  if (p.placement !== 'at-junction') return `in reach '${p.reach}' at ${f.station(p.stationM)}`;
  return `at the ${p.atReachHead ? 'upstream' : 'downstream'} end of reach '${p.reach}', ${f.station(p.stationM)}`;
}

function jumpRise(f: MessageFormatter, p: JumpWords): string {
  return `rising from ${f.length(p.upstreamDepthM)} (Froude number ${formatRatio(p.froude)}) to ${f.length(p.downstreamDepthM)}, ${describeJumpType(p.jumpType)}`;
}

/** Why the computed water surface stands above normal depth, by the class of the profile there. */
function aboveNormalCause(profileClass: string | null): string {
  if (profileClass === 'M1' || profileClass === 'S1' || profileClass === 'C1') return `backwater raises the water here (${profileClass} curve)`;
  if (profileClass === 'S2') return 'the flow has not yet drawn down to normal depth from critical depth at the head of the steep reach (S2 curve)';
  return `the computed water surface stands above normal depth here${profileClass === null ? '' : ` (${profileClass} curve)`}`;
}

/** Stations are measured along the channel from its upstream end: said once in each message that uses them. */
const STATIONS_FROM_HEAD = '(stations from the head of the channel)';

export const FINDING_MESSAGES = {
  overtopping: (
    f: MessageFormatter,
    p: { flow: string; normalDepthM: number; bankDepthM: number; section: string; profileMaximum: { depthM: number; stationM: number } | null },
  ) =>
    `Over-topping at ${p.flow}: normal depth ${f.length(p.normalDepthM)} is above the bank height ${f.length(p.bankDepthM)} of section '${p.section}' (by ${f.length(p.normalDepthM - p.bankDepthM)}).` +
    (p.profileMaximum === null
      ? ''
      : ` The computed water surface, drawn down toward the control below, is deepest at ${f.station(p.profileMaximum.stationM)} (${f.length(p.profileMaximum.depthM)}) ${STATIONS_FROM_HEAD}; the drawdown is not credited.`),

  /** Over-topping found on the water-surface profile (backwater above normal depth, or a reach with no normal depth). */
  overtoppingByProfile: (
    f: MessageFormatter,
    p: {
      flow: string;
      depthM: number;
      stationM: number;
      bankDepthM: number;
      section: string;
      ranges: readonly { readonly fromStation_m: number; readonly toStation_m: number }[];
      normalDepthM: number | null;
      profileClass: string | null;
    },
  ) => {
    const [first] = p.ranges;
    const where =
      first === undefined
        ? ''
        : ` It stands above the bank from ${f.station(first.fromStation_m)} to ${f.station(first.toStation_m)}${p.ranges.length > 1 ? ` and over ${p.ranges.length - 1} more stretch${p.ranges.length > 2 ? 'es' : ''}` : ''} ${STATIONS_FROM_HEAD}.`;
    const cause =
      p.normalDepthM === null
        ? ' The reach has no normal depth; the profile alone decides.'
        : p.normalDepthM <= p.bankDepthM
          ? ` Normal depth ${f.length(p.normalDepthM)} alone would not over-top: ${aboveNormalCause(p.profileClass)}.`
          : ` Normal depth ${f.length(p.normalDepthM)} is above the bank too.`;
    return `Over-topping at ${p.flow}: the computed water surface stands ${f.length(p.depthM)} deep at ${f.station(p.stationM)}, ${f.length(p.depthM - p.bankDepthM)} above the ${f.length(p.bankDepthM)} bank of section '${p.section}'.${where}${cause}`;
  },

  freeboardBelowRequired: (
    f: MessageFormatter,
    p: { flow: string; freeboardM: number; requiredM: number; normalDepthM: number; usbrCoefficientM: number | null },
  ) =>
    `Freeboard at ${p.flow} is ${f.length(p.freeboardM)} above normal depth ${f.length(p.normalDepthM)}; the criteria require ${f.length(p.requiredM)}` +
    (p.usbrCoefficientM === null ? '.' : ` (USBR rule F = sqrt(C y) with C = ${f.length(p.usbrCoefficientM)}).`),

  /** Freeboard judged on the water-surface profile where it stands above normal depth. */
  freeboardBelowRequiredByProfile: (
    f: MessageFormatter,
    p: { flow: string; freeboardM: number; requiredM: number; depthM: number; stationM: number; normalDepthM: number | null; profileClass: string | null; usbrCoefficientM: number | null },
  ) =>
    `Freeboard at ${p.flow} is ${f.length(p.freeboardM)} at ${f.station(p.stationM)} ${STATIONS_FROM_HEAD}, where the computed water surface stands ${f.length(p.depthM)} deep` +
    (p.normalDepthM === null ? ' (no normal depth in this reach)' : ` (normal depth ${f.length(p.normalDepthM)}: ${aboveNormalCause(p.profileClass)})`) +
    `; the criteria require ${f.length(p.requiredM)}` +
    (p.usbrCoefficientM === null ? '.' : ` (USBR rule F = sqrt(C y) with C = ${f.length(p.usbrCoefficientM)} and y the depth there).`),

  hydraulicJump: (f: MessageFormatter, p: JumpWords & { liningRemark: string }) =>
    `A hydraulic jump forms at ${p.flow} ${jumpPlace(f, p)} ${STATIONS_FROM_HEAD}, ${jumpRise(f, p)}; it dissipates ${f.length(p.energyLossM)} of head. ` +
    `Jump types after USBR Engineering Monograph 25.${p.liningRemark}`,

  hydraulicJumpSweptDown: (f: MessageFormatter, p: JumpWords & { origin: string; holding: string; liningRemark: string }) =>
    `At ${p.flow} the hydraulic jump is swept past reach '${p.holding}', the first reach below the start of the supercritical flow (in reach '${p.origin}') whose slope could hold it: ` +
    `it forms ${jumpPlace(f, p)} ${STATIONS_FROM_HEAD}, ${jumpRise(f, p)}. Its place moves with the flow and the tailwater: protect the channel wherever it can stand, or add a control that holds it.${p.liningRemark}`,

  hydraulicJumpSweptOutOfChannel: (f: MessageFormatter, p: { flow: string; origin: string; exitDepthM: number; froude: number; velocityMps: number; sequentDepthM: number }) =>
    `At ${p.flow} the water beyond the outlet is too low to hold the hydraulic jump: the supercritical flow from reach '${p.origin}' leaves the channel ${f.length(p.exitDepthM)} deep ` +
    `(Froude number ${formatRatio(p.froude)}, ${f.velocity(p.velocityMps)}), where the tailwater would have to stand ${f.length(p.sequentDepthM)} deep to hold the jump. Protect the outfall (an energy dissipator) or raise the tailwater.`,

  hydraulicJumpNotFormed: (f: MessageFormatter, p: { flow: string; origin: string; holding: string; exitDepthM: number; froude: number; velocityMps: number }) =>
    `At ${p.flow} no hydraulic jump forms in the channel: the supercritical flow from reach '${p.origin}' runs on through reach '${p.holding}', whose slope could hold a jump, ` +
    `and leaves the outlet ${f.length(p.exitDepthM)} deep (Froude number ${formatRatio(p.froude)}, ${f.velocity(p.velocityMps)}). Protect the outfall, or add a control that holds the jump in the channel.`,

  hydraulicJumpLiningExceeded: (
    f: MessageFormatter,
    p: { flow: string; lining: string; reach: string; stationM: number; velocityMps: number; permissibleMps: number | null; shearPa: number; permissiblePa: number | null },
  ) => {
    const over: string[] = [];
    if (p.permissibleMps !== null && p.velocityMps > p.permissibleMps) over.push(`enters at ${f.velocity(p.velocityMps)} where the lining permits ${f.velocity(p.permissibleMps)}`);
    if (p.permissiblePa !== null && p.shearPa > p.permissiblePa) over.push(`puts a shear of ${f.shear(p.shearPa)} on the bed under the entering flow where the lining permits ${f.shear(p.permissiblePa)}`);
    return (
      `The hydraulic jump at ${p.flow} (${f.station(p.stationM)}, reach '${p.reach}') stands on lining '${p.lining}', which does not resist it: the flow ${over.join(' and ')}. ` +
      'A jump is harsher than uniform flow at the same velocity: line its length with a rigid or heavier lining, or design a stilling basin.'
    );
  },

  /** Said with a jump when the linings under it state no limits. */
  jumpLiningNotChecked: (p: { linings: readonly string[] }) =>
    p.linings.length === 0
      ? ''
      : p.linings.length === 1
        ? ` Lining '${p.linings[0] ?? ''}' states no permissible velocity or shear, so whether it resists the jump is not checked.`
        : ` Linings ${p.linings.map((name) => `'${name}'`).join(' and ')} state no permissible velocity or shear, so whether they resist the jump is not checked.`,

  conduitSurcharged: (f: MessageFormatter, p: { flow: string; section: string; reach: string; stationM: number }) =>
    `At ${p.flow} the computed water surface reaches the crown of conduit '${p.section}' in reach '${p.reach}' near ${f.station(p.stationM)} ${STATIONS_FROM_HEAD}: ` +
    'the conduit would flow full under pressure from there upstream. The water-surface profile covers only the reaches below it; over-topping and freeboard of the reaches above are judged on normal depth at this flow. Check the hydraulic grade line by a pressure-flow method.',

  profileNotComputed: (_f: MessageFormatter, p: { flow: string; detail: string }) =>
    `The water-surface profile at ${p.flow} was not computed: ${p.detail} Over-topping and freeboard in this channel are judged on normal depth alone at this flow.`,

  /** profileNotComputed's detail for a water-level outlet in a channel without invert elevations. */
  noElevationDatum: 'the outlet water level is an elevation, but no reach of the channel gives invert elevations, so the depth it sets at the outlet is unknown. Give `inverts` for at least one reach.',

  supercriticalFlow: (f: MessageFormatter, p: { flow: string; froude: number; normalDepthM: number; criticalDepthM: number }) =>
    `Supercritical flow at ${p.flow}: Froude number ${formatRatio(p.froude)} (normal depth ${f.length(p.normalDepthM)} is below critical depth ${f.length(p.criticalDepthM)}). ` +
    'A hydraulic jump forms where the flow returns to subcritical, and bends need a superelevation check.',

  nearCriticalFlow: (_f: MessageFormatter, p: { flow: string; froude: number; low: number; high: number; bandOrigin: CriterionOrigin }) =>
    `Near-critical flow at ${p.flow}: Froude number ${formatRatio(p.froude)} is within the band ${p.low} to ${p.high} to avoid, where the water surface is unstable and wavy` +
    (p.bandOrigin === 'default'
      ? ` (${DEFAULT_NEAR_CRITICAL_FROUDE_BAND.source}).`
      : p.bandOrigin === 'setting'
        ? ` (band ${CRITERION_FROM_SETTING}).`
        : ' (band set in the criteria).'),

  velocityAbovePermissible: (f: MessageFormatter, p: { flow: string; velocityMps: number; permissibleMps: number; lining: string; margin: number }) =>
    `Velocity at ${p.flow} is ${f.velocity(p.velocityMps)}, above the ${f.velocity(p.permissibleMps)} that lining '${p.lining}' permits ` +
    `(by ${formatPercent(p.velocityMps / p.permissibleMps - 1)}; more than ${formatPercent(p.margin)} over is an error).`,

  shearAbovePermissible: (f: MessageFormatter, p: { flow: string; shearPa: number; permissiblePa: number; lining: string; margin: number }) =>
    `Maximum shear on the bed at ${p.flow} is ${f.shear(p.shearPa)}, above the ${f.shear(p.permissiblePa)} that lining '${p.lining}' permits ` +
    `(by ${formatPercent(p.shearPa / p.permissiblePa - 1)}; more than ${formatPercent(p.margin)} over is an error).`,

  velocityBelowSelfCleansing: (f: MessageFormatter, p: { flow: string; velocityMps: number; minimumMps: number }) =>
    `Velocity at ${p.flow} is ${f.velocity(p.velocityMps)}, below the self-cleansing minimum of ${f.velocity(p.minimumMps)}: sediment may settle.`,

  conduitOverCapacity: (f: MessageFormatter, p: { flow: string; dischargeM3s: number; section: string; peakCapacityM3s: number; fullCapacityM3s: number | null }) =>
    `${p.flow} (${f.discharge(p.dischargeM3s)}) is more than conduit '${p.section}' can carry in open-channel flow: its largest uniform-flow capacity is ${f.discharge(p.peakCapacityM3s)}` +
    (p.fullCapacityM3s === null ? '' : ` (${f.discharge(p.fullCapacityM3s)} flowing full)`) +
    '. It would flow under pressure.',

  conduitTwoDepthZone: (f: MessageFormatter, p: { flow: string; dischargeM3s: number; section: string; normalDepthM: number; fullCapacityM3s: number; peakCapacityM3s: number }) =>
    `${p.flow} (${f.discharge(p.dischargeM3s)}) lies between the full-pipe capacity ${f.discharge(p.fullCapacityM3s)} and the peak capacity ${f.discharge(p.peakCapacityM3s)} of conduit '${p.section}': ` +
    `two normal depths carry it and the lower, ${f.length(p.normalDepthM)}, is reported. A little more flow or roughness fills the pipe.`,

  noNormalDepth: (f: MessageFormatter, p: { flow: string; slope: number }) =>
    `No normal depth at ${p.flow}: the bed ${p.slope === 0 ? 'is horizontal' : `rises downstream (slope ${f.slope(p.slope)})`}, so uniform-flow checks are skipped for this reach.`,

  depthSolveFailed: (_f: MessageFormatter, p: { flow: string; detail: string }) => `Depths at ${p.flow} could not be computed: ${p.detail}`,
} as const;

/**
 * The criterion each finding is judged against, by its key in ResolvedCriteria.origin; the near-critical band says
 * where it came from in its own message.
 */
const CRITERION_OF_FINDING: Readonly<Record<string, { readonly key: string; readonly words: string }>> = {
  [FINDING_CODES.freeboardBelowRequired]: { key: 'freeboard', words: 'The required freeboard is' },
  [FINDING_CODES.velocityBelowSelfCleansing]: { key: 'minVelocity', words: 'The self-cleansing minimum is' },
  [FINDING_CODES.velocityAbovePermissible]: { key: 'limitMargin', words: 'The limit margin is' },
  [FINDING_CODES.shearAbovePermissible]: { key: 'limitMargin', words: 'The limit margin is' },
};

/**
 * Said after a finding judged against a criterion that came from an editor setting or command-line option, so that
 * whoever reads the finding knows the file alone does not explain it; '' otherwise.
 */
export function criterionFromSettingRemark(code: string, origin: Readonly<Record<string, CriterionOrigin>>): string {
  const criterion = CRITERION_OF_FINDING[code];
  return criterion !== undefined && origin[criterion.key] === 'setting' ? ` ${criterion.words} ${CRITERION_FROM_SETTING}.` : '';
}

/** How the normal-depth remark reads when a conduit flows on the lower of two depths. */
export const LOWER_OF_TWO_DEPTHS_NOTE =
  'Lower of two normal depths: the flow is between full-pipe capacity and the conduit\'s peak uniform-flow capacity.';
