/**
 * Water-surface profiles of channels: gradually varied flow by the standard step method, controls, hydraulic
 * jumps and profile classes. Pure functions over SI numbers; nothing here throws for bad numbers or physical
 * no-solution cases.
 *
 * Entry point, one call per channel and flow:
 *
 *     const result = computeChannelProfile({
 *       reaches: [{ name: 'upper', section, manningN: 0.025, bedSlope: 0.002, lengthM: 400, bankHeightM: 1.2 }, ...],
 *       dischargeM3s: 3.5,
 *       outlet: { kind: 'water-level', elevationM: 101.2 },   // or { kind: 'free-fall' } / { kind: 'normal-depth' }
 *     });
 *     if (result.converged) { result.points; result.reaches[i].maximumDepthM; result.jumps; result.notes; ... }
 *     else { result.reason; result.message; result.stationM; }
 */
export * from './profile-types.js';
export { computeChannelProfile, profileProvenance, type ResolvedStepControl } from './channel-profile.js';
export { ProfileReuse } from './reach-reuse.js';
export { classifyProfile, classifySegment, describeSegmentClass } from './profile-class.js';
export { classifyJump, describeJumpType, jumpEnergyLossM, solveSequentDepth, type SequentDepthResult } from './hydraulic-jump.js';
export { directStepProfile, type DirectStepInput, type DirectStepPoint, type DirectStepResult } from './direct-step.js';
export { solveStandardStep, type StandardStepOutcome } from './standard-step.js';
export { describeReachFlow, type ReachFlow, type ReachFlowResult } from './reach-flow.js';
export type { FlowBranch } from './flow-branch.js';
export * from './profile-defaults.js';
