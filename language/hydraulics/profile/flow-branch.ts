/**
 * The two branches of the specific-energy curve a profile can follow. Subcritical profiles are computed
 * upstream from a downstream control, supercritical ones downstream from an upstream control (Chow 1959, Ch. 9-10).
 */
export type FlowBranch = 'subcritical' | 'supercritical';
