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
 * for bit, the same subcritical march object for the supercritical one it is compared with. Equal inputs give
 * equal results, so a profile computed with reuse equals the profile computed without, field for field
 * (test/hydraulics/profile/reach-reuse.test.ts). A march is remembered with the steps it took and taken over only
 * when the step budget left covers them, so a computation that would run out of steps still does.
 *
 * Memory: a generation is one analysis; entries used in the current or the previous generation are kept.
 */
import type { JunctionOutcome } from './junction.js';
import type { ReachFlow, ReachFlowResult } from './reach-flow.js';
import type { SectionGeometry } from '../sections/section-geometry.js';
import type { MarchSettings, StepBudget } from './standard-step.js';

/** A remembered computation and the profile steps it took. */
interface RememberedMarch<T> {
  readonly value: T;
  readonly steps: number;
}

export class ProfileReuse {
  /** Marches and flow descriptions taken over and computed since this object was made (for tests and benchmarks). */
  readonly counts = { reused: 0, computed: 0 };
  private current = new Map<string, unknown>();
  private previous = new Map<string, unknown>();
  private readonly ids = new WeakMap<object, number>();
  private nextId = 0;

  /** Starts a generation: entries not used since the previous one are dropped. */
  startGeneration(): void {
    this.previous = this.current;
    this.current = new Map();
  }

  /** The flow description of a reach (describeReachFlow), computed once per section object and numbers. */
  reachFlow(section: SectionGeometry, manningN: number, bedSlope: number, dischargeM3s: number, alpha: number, compute: () => ReachFlowResult): ReachFlowResult {
    return this.remember(`flow|${this.idOf(section)}|${manningN}|${bedSlope}|${dischargeM3s}|${alpha}`, compute);
  }

  /**
   * A junction balance (junction.ts): `dropM` is the unknown side's invert minus the known side's, computed as the
   * balance computes it; nothing else of the elevations enters it.
   */
  junction(knownFlow: ReachFlow, knownDepthM: number, unknownFlow: ReachFlow, dropM: number, branch: string, lossCoefficient: number, compute: () => JunctionOutcome): JunctionOutcome {
    return this.remember(`junction|${this.idOf(knownFlow)}|${knownDepthM}|${this.idOf(unknownFlow)}|${dropM}|${branch}|${lossCoefficient}`, compute);
  }

  private remember<T>(key: string, compute: () => T): T {
    const remembered = this.get<T>(key);
    if (remembered !== undefined) {
      this.counts.reused++;
      return remembered;
    }
    this.counts.computed++;
    const result = compute();
    this.current.set(key, result);
    return result;
  }

  /**
   * A march of one reach, by a key the caller builds from every other input (reachMarchKey plus its own numbers);
   * `keep` says whether the result may be remembered (not when it ran out of steps).
   */
  march<T>(key: string, budget: StepBudget, compute: () => T, keep: (value: T) => boolean): T {
    const remembered = this.get<RememberedMarch<T>>(key);
    if (remembered !== undefined && budget.remaining >= remembered.steps) {
      budget.remaining -= remembered.steps;
      this.counts.reused++;
      return remembered.value;
    }
    this.counts.computed++;
    const before = budget.remaining;
    const value = compute();
    if (keep(value)) this.current.set(key, { value, steps: before - budget.remaining });
    return value;
  }

  /** The part of a march key every march of one reach shares: its flow object, length and step settings. */
  reachMarchKey(flow: ReachFlow, lengthM: number, settings: MarchSettings): string {
    return `${this.idOf(flow)}|${lengthM}|${settings.maximumStepLengthM}|${settings.maximumDepthChangeRatio}`;
  }

  /** A number standing for one object while it lives (objects, not values: the caller keeps objects stable). */
  idOf(object: object): number {
    let id = this.ids.get(object);
    if (id === undefined) {
      id = this.nextId++;
      this.ids.set(object, id);
    }
    return id;
  }

  private get<T>(key: string): T | undefined {
    if (this.current.has(key)) return this.current.get(key) as T;
    if (!this.previous.has(key)) return undefined;
    const value = this.previous.get(key) as T;
    this.current.set(key, value);
    return value;
  }
}
