/**
 * Work on single reaches that a profile computation may take over from earlier computations: a reach's flow
 * description (critical and normal depth, slope class), its subcritical and supercritical marches and the balances
 * at its junctions, each remembered under every input it depends on.
 *
 * Why: an editor recomputes a channel's profiles on every edit, and an edit usually changes one reach. In
 * subcritical flow its effect travels upstream only until a critical-depth control (the brink of a drop, a break
 * to a steep slope), in supercritical flow downstream only until a jump; the marches of the other reaches have the
 * same inputs as before and give the same numbers. For that to hold across an edit that moves the bed up or down
 * (a changed slope lifts every invert above it), the junction balance works with the drop between the two inverts,
 * not with elevations (junction.ts), so no march depends on where the bed stands, only on its shape.
 *
 * Keys are exact: the same section object (callers keep one object per unchanged section), the same numbers bit
 * for bit (Object.is), the same subcritical march object for the supercritical one it is compared with. Equal inputs
 * give equal results, so a profile computed with reuse equals the profile computed without, field for field
 * (test/hydraulics/profile/reach-reuse.test.ts). A march is remembered with the steps it took and taken over only
 * when the step budget left covers them, so a computation that would run out of steps still does.
 *
 * Lookup: every computation is filed under an object it depends on (the section for a flow description, the reach's
 * flow description for a march or a junction) and one of its numbers, then found among the few filed there by
 * comparing its other inputs one by one. Building a text key of every input instead cost more than a third of the
 * engine's time on an edit of a 50-reach channel (number-to-text conversions and hashing of long keys).
 *
 * Memory: a generation is one analysis; entries used in the current or the previous generation are kept, older ones
 * are dropped when their list is next searched, and a list goes with the object it is filed under.
 */
import type { JunctionOutcome } from './junction.js';
import type { ReachFlow, ReachFlowResult } from './reach-flow.js';
import type { SectionGeometry } from '../sections/section-geometry.js';
import type { MarchSettings, StepBudget } from './standard-step.js';

/** A remembered computation: its inputs besides the object and number it is filed under, and the steps it took. */
interface Entry {
  /** The number it is filed under, exactly (the list's Map key does not tell 0 from -0). */
  readonly number: number;
  readonly inputs: readonly unknown[];
  readonly value: unknown;
  readonly steps: number;
  generation: number;
}

export class ProfileReuse {
  /**
   * Marches, flow descriptions and junction balances taken over and computed since this object was made, and the
   * milliseconds spent inside the computations (for tests and benchmarks: what an edit cannot avoid computing).
   */
  readonly counts = { reused: 0, computed: 0, computedMs: 0 };
  /** Computations under way: one computed inside another is timed with the outer one only. */
  private computing = 0;
  private readonly filed = new WeakMap<object, Map<number, Entry[]>>();
  private generation = 0;

  /** Starts a generation: entries not used since the previous one are dropped. */
  startGeneration(): void {
    this.generation++;
  }

  /** The flow description of a reach (describeReachFlow), computed once per section object and numbers. */
  reachFlow(section: SectionGeometry, manningN: number, bedSlope: number, dischargeM3s: number, alpha: number, compute: () => ReachFlowResult): ReachFlowResult {
    return this.remember(section, bedSlope, ['flow', manningN, dischargeM3s, alpha], compute);
  }

  /**
   * A junction balance (junction.ts): `dropM` is the unknown side's invert minus the known side's, computed as the
   * balance computes it; nothing else of the elevations enters it.
   */
  junction(knownFlow: ReachFlow, knownDepthM: number, unknownFlow: ReachFlow, dropM: number, branch: string, lossCoefficient: number, compute: () => JunctionOutcome): JunctionOutcome {
    return this.remember(knownFlow, knownDepthM, ['junction', unknownFlow, dropM, branch, lossCoefficient], compute);
  }

  /**
   * A reach's share of the assembled profile (profile-assembly.ts), made from its subcritical trace (filed under the
   * trace's march, whose arrays are the same objects when the march was taken over), its supercritical piece and its
   * flow description. Not counted among the reach computations.
   */
  reachAssembly<T>(
    trace: { readonly stationsM: readonly number[]; readonly depthsM: readonly number[]; readonly noSubcriticalDepthAboveM: number | undefined; readonly noSubcriticalDepthReason: string | undefined },
    piece: object | undefined,
    flow: ReachFlow,
    lengthM: number,
    bankHeightM: number | undefined,
    compute: () => T,
  ): T {
    const inputs = ['assembly', trace.depthsM, trace.noSubcriticalDepthAboveM, trace.noSubcriticalDepthReason, piece, flow, bankHeightM];
    return this.remember(trace.stationsM, lengthM, inputs, compute, false);
  }

  private remember<T>(owner: object, number: number, inputs: readonly unknown[], compute: () => T, counted = true): T {
    const found = this.find(owner, number, inputs);
    if (found !== undefined) {
      if (counted) this.counts.reused++;
      return found.value as T;
    }
    const value = counted ? this.timed(compute) : compute();
    this.file(owner, number, inputs, value, 0);
    return value;
  }

  private timed<T>(compute: () => T): T {
    this.counts.computed++;
    if (this.computing > 0) return compute();
    this.computing++;
    const start = performance.now();
    try {
      return compute();
    } finally {
      this.counts.computedMs += performance.now() - start;
      this.computing--;
    }
  }

  /**
   * A march of one reach from `startDepthM`: `inputs` are every other input (marchInputs, then the caller's own);
   * `keep` says whether the result may be remembered (not when it ran out of steps).
   */
  march<T>(flow: ReachFlow, startDepthM: number, inputs: readonly unknown[], budget: StepBudget, compute: () => T, keep: (value: T) => boolean): T {
    const found = this.find(flow, startDepthM, inputs);
    if (found !== undefined && budget.remaining >= found.steps) {
      budget.remaining -= found.steps;
      this.counts.reused++;
      return found.value as T;
    }
    const before = budget.remaining;
    const value = this.timed(compute);
    if (keep(value)) this.file(flow, startDepthM, inputs, value, before - budget.remaining);
    return value;
  }

  private find(owner: object, number: number, inputs: readonly unknown[]): Entry | undefined {
    const list = this.filed.get(owner)?.get(number);
    if (list === undefined) return undefined;
    let found: Entry | undefined;
    let live = 0;
    for (const entry of list) {
      if (entry.generation < this.generation - 1) continue;
      list[live++] = entry;
      if (found === undefined && Object.is(entry.number, number) && sameInputs(entry.inputs, inputs)) found = entry;
    }
    list.length = live;
    if (found !== undefined) found.generation = this.generation;
    return found;
  }

  private file(owner: object, number: number, inputs: readonly unknown[], value: unknown, steps: number): void {
    let byNumber = this.filed.get(owner);
    if (byNumber === undefined) {
      byNumber = new Map();
      this.filed.set(owner, byNumber);
    }
    const entry: Entry = { number, inputs, value, steps, generation: this.generation };
    const list = byNumber.get(number);
    if (list === undefined) byNumber.set(number, [entry]);
    else list.push(entry);
  }
}

/** The inputs every march of one reach shares besides its flow description: its length and step settings. */
export function marchInputs(kind: 'subcritical' | 'supercritical', lengthM: number, settings: MarchSettings): unknown[] {
  return [kind, lengthM, settings.maximumStepLengthM, settings.maximumDepthChangeRatio];
}

function sameInputs(left: readonly unknown[], right: readonly unknown[]): boolean {
  if (left.length !== right.length) return false;
  for (let index = 0; index < left.length; index++) if (!Object.is(left[index], right[index])) return false;
  return true;
}
