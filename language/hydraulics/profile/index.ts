/**
 * Water-surface profiles of channels: gradually varied flow by the standard step method, controls, hydraulic
 * jumps and profile classes. Pure functions over SI numbers. Entry point: computeChannelProfile.
 */
export * from './profile-types.js';
export { computeChannelProfile, profileProvenance } from './channel-profile.js';
export { classifyProfile, classifySegment, describeSegmentClass } from './profile-class.js';
export { classifyJump, describeJumpType, jumpEnergyLossM, solveSequentDepth, type SequentDepthResult } from './hydraulic-jump.js';
export { directStepProfile, type DirectStepInput, type DirectStepPoint, type DirectStepResult } from './direct-step.js';
export { solveStandardStep, type StandardStepOutcome } from './standard-step.js';
export { describeReachFlow, type ReachFlow, type ReachFlowResult } from './reach-flow.js';
export type { FlowBranch } from './flow-branch.js';
export * from './profile-defaults.js';
