/**
 * The findings of the analysis: each code, its severity rule and its message, in one place. Messages give numbers
 * with units in the design's display units and name the flow they concern.
 */
import type { UnitSystem } from '../units/units.js';
import { formatPercent, formatQuantity, formatRatio } from './format-quantity.js';
import { DEFAULT_NEAR_CRITICAL_FROUDE_BAND } from './criteria-defaults.js';

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
}

export const FINDING_MESSAGES = {
  overtopping: (f: MessageFormatter, p: { flow: string; normalDepthM: number; bankDepthM: number; section: string }) =>
    `Over-topping at ${p.flow}: normal depth ${f.length(p.normalDepthM)} is above the bank height ${f.length(p.bankDepthM)} of section '${p.section}' (by ${f.length(p.normalDepthM - p.bankDepthM)}).`,

  freeboardBelowRequired: (
    f: MessageFormatter,
    p: { flow: string; freeboardM: number; requiredM: number; normalDepthM: number; usbrCoefficientM: number | null },
  ) =>
    `Freeboard at ${p.flow} is ${f.length(p.freeboardM)} above normal depth ${f.length(p.normalDepthM)}; the criteria require ${f.length(p.requiredM)}` +
    (p.usbrCoefficientM === null ? '.' : ` (USBR rule F = sqrt(C y) with C = ${f.length(p.usbrCoefficientM)}).`),

  supercriticalFlow: (f: MessageFormatter, p: { flow: string; froude: number; normalDepthM: number; criticalDepthM: number }) =>
    `Supercritical flow at ${p.flow}: Froude number ${formatRatio(p.froude)} (normal depth ${f.length(p.normalDepthM)} is below critical depth ${f.length(p.criticalDepthM)}). ` +
    'A hydraulic jump forms where the flow returns to subcritical, and bends need a superelevation check.',

  nearCriticalFlow: (_f: MessageFormatter, p: { flow: string; froude: number; low: number; high: number; bandIsDefault: boolean }) =>
    `Near-critical flow at ${p.flow}: Froude number ${formatRatio(p.froude)} is within the band ${p.low} to ${p.high} to avoid, where the water surface is unstable and wavy` +
    (p.bandIsDefault ? ` (${DEFAULT_NEAR_CRITICAL_FROUDE_BAND.source}).` : ' (band set in the criteria).'),

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

/** How the normal-depth remark reads when a conduit flows on the lower of two depths. */
export const LOWER_OF_TWO_DEPTHS_NOTE =
  'Lower of two normal depths: the flow is between full-pipe capacity and the conduit\'s peak uniform-flow capacity.';
