/**
 * Reaches and channels: each reach says its section, lining, length and slope (or inverts); the bed falls
 * downstream (otherwise there is no normal depth); every flow has a discharge in every reach; each channel has
 * reaches and one outlet condition.
 */
import { AstUtils, type ValidationAcceptor, type ValidationChecks } from 'langium';
import {
  isBedSlope,
  isInverts,
  isOutlet,
  isReach,
  isRunnelFile,
  type BedSlope,
  type Channel,
  type FlowChanges,
  type Inverts,
  type Reach,
  type RunnelAstType,
} from '../generated/ast.js';
import { displayUnitsOf } from '../analysis/analyze-design.js';
import { channelFlowDischarges, designFlows, reachParts } from '../analysis/design-inputs.js';
import { formatQuantity } from '../analysis/format-quantity.js';
import { quantitySI } from '../analysis/quantities.js';
import { DIAGNOSTICS, PROPERTY_WORDS, report } from './diagnostic-messages.js';

/** Section, lining, length, and a slope or inverts (not both), each once. */
export function reachMustBeComplete(reach: Reach, accept: ValidationAcceptor): void {
  const name = reach.name ?? '';
  const parts = reachParts(reach);
  const missing = (what: string, example: string, key: string): void =>
    report(accept, DIAGNOSTICS.reachIncomplete, { reach: name, what, example }, { node: reach, property: 'name' }, { missing: key });
  if (parts.sectionUse === undefined) missing('a section', '`section name`', 'section');
  if (parts.liningUse === undefined) missing('a lining', '`lining name`', 'lining');
  if (parts.length === undefined) missing('a length', '`length 300 ft`', 'length');
  if (parts.bedSlope === undefined && parts.inverts === undefined) missing('a slope or inverts', '`slope 0.5 %` or `inverts 101.2 ft to 100.4 ft`', 'slope');

  const seen = new Set<string>();
  let slopeSeen = false;
  for (const property of reach.properties ?? []) {
    const type = property.$type;
    if (type === 'FlowChanges' || type === 'Criteria') continue;
    if (seen.has(type)) {
      report(accept, DIAGNOSTICS.propertyRepeated, { what: PROPERTY_WORDS[type] ?? type, where: `reach '${name}'` }, { node: property });
    } else if ((isBedSlope(property) || isInverts(property)) && slopeSeen) {
      report(accept, DIAGNOSTICS.slopeAndInverts, {}, { node: property });
    }
    if (isBedSlope(property) || isInverts(property)) slopeSeen = true;
    seen.add(type);
  }
}

/** A horizontal or rising bed has no normal depth: reported at the slope, or at the inverts. */
export function slopeShouldFall(node: BedSlope | Inverts, accept: ValidationAcceptor): void {
  let slope: number | undefined;
  if (isBedSlope(node)) {
    slope = quantitySI(node.value);
  } else {
    const upstreamM = quantitySI(node.upstream);
    const downstreamM = quantitySI(node.downstream);
    if (upstreamM === undefined || downstreamM === undefined) return;
    const lengthM = quantitySI(reachParts(node.$container).length?.value);
    // Without a usable length there is no slope to state; the missing length is reported on its own.
    if (lengthM === undefined || !(lengthM > 0)) return;
    slope = (upstreamM - downstreamM) / lengthM;
    if (!Number.isFinite(slope)) {
      report(accept, DIAGNOSTICS.invertSlopeTooLarge, {}, { node });
      return;
    }
  }
  if (slope === undefined || slope > 0) return;
  const root = AstUtils.findRootNode(node);
  const system = isRunnelFile(root) ? displayUnitsOf(root).system : 'SI';
  const slopeText = formatQuantity(slope, 'slope', system);
  report(accept, DIAGNOSTICS.slopeNotFalling, { slopeText, horizontal: slope === 0 }, { node: isBedSlope(node) ? node.value : node }, { slope });
}

/** `flows { q10 = 5 cfs  q10 = 6 cfs }` */
export function flowChangesMustNotRepeat(changes: FlowChanges, accept: ValidationAcceptor): void {
  const seen = new Set<string>();
  for (const change of changes.changes ?? []) {
    const name = change.flow?.$refText;
    if (!name) continue;
    if (seen.has(name)) report(accept, DIAGNOSTICS.propertyRepeated, { what: `flow '${name}'`, where: 'this flows block' }, { node: change });
    seen.add(name);
  }
}

/** Reaches, an outlet once, and a discharge for every flow in every reach. */
export function channelMustBeCheckable(channel: Channel, accept: ValidationAcceptor): void {
  const name = channel.name ?? '';
  const members = channel.members ?? [];
  const reaches = members.filter(isReach);
  const outlets = members.filter(isOutlet);
  if (reaches.length === 0) report(accept, DIAGNOSTICS.channelHasNoReaches, { channel: name }, { node: channel, property: 'name' });
  if (outlets.length === 0) report(accept, DIAGNOSTICS.outletMissing, { channel: name }, { node: channel, property: 'name' });
  for (const repeated of outlets.slice(1)) {
    report(accept, DIAGNOSTICS.propertyRepeated, { what: PROPERTY_WORDS['Outlet'] ?? 'the outlet', where: `channel '${name}'` }, { node: repeated });
  }
  if (reaches.length === 0) return;
  const root = AstUtils.findRootNode(channel);
  if (!isRunnelFile(root)) return;
  const flows = designFlows(root);
  if (flows.length === 0) {
    report(accept, DIAGNOSTICS.noFlows, { channel: name }, { node: channel, property: 'name' });
    return;
  }
  const discharges = channelFlowDischarges(channel, flows);
  for (const flow of flows) {
    if (!flow.name) continue;
    const lacking = reaches.filter((reach) => !(discharges.get(reach)?.has(flow) ?? false)).map((reach) => reach.name ?? '');
    if (lacking.length === 0) continue;
    report(
      accept,
      DIAGNOSTICS.flowDischargeMissing,
      { flow: flow.name, channel: name, reaches: lacking, allReaches: lacking.length === reaches.length },
      { node: channel, property: 'name' },
      { flow: flow.name },
    );
  }
}

export const reachChecks: ValidationChecks<RunnelAstType> = {
  Reach: reachMustBeComplete,
  BedSlope: slopeShouldFall,
  Inverts: slopeShouldFall,
  FlowChanges: flowChangesMustNotRepeat,
  Channel: channelMustBeCheckable,
};

