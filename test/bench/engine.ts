/**
 * Engine speed: normal-depth and critical-depth solves per second and mean discharge (conveyance or section-factor)
 * evaluations per solve, for each section shape, beside a plain bisection solver held to the same tolerance and run
 * in the same process on the same cases. Run with `npm run bench` (all bench modules) or `npm run bench -- engine` (from a
 * bundle, as the code ships: run-all.ts).
 *
 * Inputs are realistic design ranges (SI; "log" = log-uniform, others uniform), drawn from a fixed seed:
 * - rectangle (lined channel): width 0.3-6 m; Q 0.05-100 m3/s log; n 0.012-0.045; S 0.0005-0.03 log
 * - trapezoid (earth or lined channel): bottom 0.3-6 m, each side 1:1-4:1 (H:V); Q, n, S as the rectangle
 * - triangle (V-ditch): each side 1:1-6:1; Q 0.01-5 m3/s log; n 0.016-0.045; S 0.0005-0.05 log
 * - parabola (grassed swale): top width 1-10 m at 0.3-1 m depth; Q 0.02-20 m3/s log; n 0.025-0.05; S 0.0005-0.03 log
 * - circle (storm drain): diameter 0.3-2.4 m; n 0.011-0.015; S 0.0005-0.05 log; Q from 1% to 107% of full-pipe
 *   capacity (log), so the two-depth zone near the crown is included; critical depth uses the same flows.
 * Each shape has 1,000 distinct sections and 100,000 flow cases. The bisection baseline brackets the depth in
 * [0, 1 m] and doubles the top until it holds the root (a conduit's bracket is [0, conveyance peak], as the
 * engine's), then halves until |F(y) - F| <= tolerance x F on the same F the engine uses (K^3 = A^3 R^2 and
 * Z^2 = A^3 / T), so both pay the same per evaluation and the ratios measure the method.
 */
import { cpus, loadavg } from 'node:os';
import { pathToFileURL } from 'node:url';
import {
  circleSection,
  conduitConveyance,
  DEPTH_SOLVE_RELATIVE_TOLERANCE,
  GRAVITY_MS2,
  parabolaSection,
  rectangleSection,
  solveCriticalDepth,
  solveNormalDepth,
  trapezoidSection,
  triangleSection,
  type SectionGeometry,
  type SectionShape,
} from '../../language/hydraulics/index.js';

const SECTIONS_PER_SHAPE = 1_000;
const CASES_PER_SHAPE = 100_000;
const TIMED_PASSES = 7;

interface CaseSet {
  readonly shape: SectionShape;
  readonly ranges: string;
  readonly sections: readonly SectionGeometry[];
  readonly dischargeM3s: Float64Array;
  readonly manningN: Float64Array;
  readonly bedSlope: Float64Array;
}

interface Measurement {
  /** Solves per CPU-second of this process, median of the timed passes. */
  readonly solvesPerSecond: number;
  /** The same, fastest pass. */
  readonly fastestSolvesPerSecond: number;
  /** Solves per wall-clock second, median pass (lower than the CPU figure when the machine is busy). */
  readonly wallSolvesPerSecond: number;
  readonly evaluationsPerSolve: number;
  readonly failures: number;
}

/** Prints the engine figures; see the module comment for what is measured and on which inputs. */
export async function run(): Promise<void> {
  const caseSets = buildCaseSets();
  // Warm every solver on every shape first, so each shape is timed with the call sites as mixed as in real use.
  for (const caseSet of caseSets) {
    timeNormal(caseSet);
    timeCritical(caseSet);
    timeBisectionNormal(caseSet);
    timeBisectionCritical(caseSet);
  }
  const [oneMinuteLoad] = loadavg();
  console.log(`Engine: depth solves per CPU-second, one thread (median of ${TIMED_PASSES} passes over ${CASES_PER_SHAPE.toLocaleString('en-US')} cases per shape)`);
  console.log(`Tolerance ${DEPTH_SOLVE_RELATIVE_TOLERANCE} relative on Q (normal) and on Z = A sqrt(A/T) (critical); ${cpus().length} cores, load average ${oneMinuteLoad?.toFixed(2)} at start.`);
  console.log('');
  const header = ['shape', 'solve', 'engine solves/s', 'evals/solve', 'bisection solves/s', 'evals/solve', 'fewer evals', 'faster'];
  const rows: string[][] = [];
  let trapezoidNormal: Measurement | undefined;
  let trapezoidBisection: Measurement | undefined;
  for (const caseSet of caseSets) {
    for (const kind of ['normal', 'critical'] as const) {
      const engine = kind === 'normal' ? timeNormal(caseSet) : timeCritical(caseSet);
      const bisection = kind === 'normal' ? timeBisectionNormal(caseSet) : timeBisectionCritical(caseSet);
      if (caseSet.shape === 'trapezoid' && kind === 'normal') {
        trapezoidNormal = engine;
        trapezoidBisection = bisection;
      }
      rows.push([
        caseSet.shape,
        kind,
        formatRate(engine.solvesPerSecond) + (engine.failures > 0 ? ` (${engine.failures} unsolved)` : ''),
        engine.evaluationsPerSolve.toFixed(2),
        formatRate(bisection.solvesPerSecond),
        bisection.evaluationsPerSolve.toFixed(1),
        `${(bisection.evaluationsPerSolve / engine.evaluationsPerSolve).toFixed(1)}x`,
        `${(engine.solvesPerSecond / bisection.solvesPerSecond).toFixed(1)}x`,
      ]);
    }
  }
  printTable(header, rows);
  console.log('');
  for (const caseSet of caseSets) console.log(`  ${caseSet.shape}: ${caseSet.ranges}`);
  if (trapezoidNormal !== undefined && trapezoidBisection !== undefined) {
    const ratio = trapezoidBisection.evaluationsPerSolve / trapezoidNormal.evaluationsPerSolve;
    console.log('');
    console.log('Targets (trapezoid normal depth):');
    console.log(`  >= 2,000,000 solves/s on one core: ${formatRate(trapezoidNormal.solvesPerSecond)} per CPU-second ${verdict(trapezoidNormal.solvesPerSecond >= 2e6)}` + ` (fastest pass ${formatRate(trapezoidNormal.fastestSolvesPerSecond)}; wall clock ${formatRate(trapezoidNormal.wallSolvesPerSecond)})`);
    console.log(`  <= 6 evaluations per solve: ${trapezoidNormal.evaluationsPerSolve.toFixed(2)} ${verdict(trapezoidNormal.evaluationsPerSolve <= 6)}`);
    console.log(`  >= 5x fewer evaluations than bisection: ${ratio.toFixed(1)}x ${verdict(ratio >= 5)}`);
  }
}

function verdict(met: boolean): string {
  return met ? '(met)' : '(NOT met)';
}

// ----------------------------------------------------------------------------------------------------------------
// Timed loops

function timeNormal(caseSet: CaseSet): Measurement {
  const { sections, dischargeM3s, manningN, bedSlope } = caseSet;
  return timePasses((): { evaluations: number; failures: number } => {
    let evaluations = 0;
    let failures = 0;
    for (let i = 0; i < CASES_PER_SHAPE; i++) {
      const result = solveNormalDepth(sections[i % SECTIONS_PER_SHAPE]!, { dischargeM3s: dischargeM3s[i]!, manningN: manningN[i]!, bedSlope: bedSlope[i]! });
      evaluations += result.evaluations;
      if (!result.converged) failures++;
    }
    return { evaluations, failures };
  });
}

function timeCritical(caseSet: CaseSet): Measurement {
  const { sections, dischargeM3s } = caseSet;
  return timePasses(() => {
    let evaluations = 0;
    let failures = 0;
    for (let i = 0; i < CASES_PER_SHAPE; i++) {
      const result = solveCriticalDepth(sections[i % SECTIONS_PER_SHAPE]!, dischargeM3s[i]!);
      evaluations += result.evaluations;
      if (!result.converged) failures++;
    }
    return { evaluations, failures };
  });
}

function timeBisectionNormal(caseSet: CaseSet): Measurement {
  const { sections, dischargeM3s, manningN, bedSlope } = caseSet;
  return timePasses(() => {
    let evaluations = 0;
    let failures = 0;
    for (let i = 0; i < CASES_PER_SHAPE; i++) {
      const section = sections[i % SECTIONS_PER_SHAPE]!;
      const targetConveyance = (dischargeM3s[i]! * manningN[i]!) / Math.sqrt(bedSlope[i]!);
      const peakDepthM = conduitConveyance(section)?.peakDepthM;
      const outcome = bisect(conveyanceCubed, section, targetConveyance ** 3, 3, peakDepthM);
      evaluations += outcome.evaluations;
      if (!outcome.converged) failures++;
    }
    return { evaluations, failures };
  });
}

function timeBisectionCritical(caseSet: CaseSet): Measurement {
  const { sections, dischargeM3s } = caseSet;
  return timePasses(() => {
    let evaluations = 0;
    let failures = 0;
    for (let i = 0; i < CASES_PER_SHAPE; i++) {
      const section = sections[i % SECTIONS_PER_SHAPE]!;
      const outcome = bisect(sectionFactorSquared, section, (dischargeM3s[i]! * dischargeM3s[i]!) / GRAVITY_MS2, 2, section.fullDepthM);
      evaluations += outcome.evaluations;
      if (!outcome.converged) failures++;
    }
    return { evaluations, failures };
  });
}

/**
 * Runs a pass TIMED_PASSES times. Rates are per second of this process's own CPU time (user + system, which also
 * counts any garbage-collector threads, so it can only understate), because the machine is shared: wall-clock time
 * includes time the process spent descheduled. The median pass is reported; fastest and wall-clock for reference.
 */
function timePasses(pass: () => { evaluations: number; failures: number }): Measurement {
  const cpuRates: number[] = [];
  const wallRates: number[] = [];
  let evaluations = 0;
  let failures = 0;
  for (let passIndex = 0; passIndex < TIMED_PASSES; passIndex++) {
    const wallStart = process.hrtime.bigint();
    const cpuStart = process.cpuUsage();
    const counts = pass();
    const cpu = process.cpuUsage(cpuStart);
    const wallSeconds = Number(process.hrtime.bigint() - wallStart) / 1e9;
    cpuRates.push(CASES_PER_SHAPE / Math.max((cpu.user + cpu.system) / 1e6, 1e-6));
    wallRates.push(CASES_PER_SHAPE / wallSeconds);
    evaluations = counts.evaluations;
    failures = counts.failures;
  }
  const median = (values: number[]): number => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!;
  return {
    solvesPerSecond: median(cpuRates),
    fastestSolvesPerSecond: Math.max(...cpuRates),
    wallSolvesPerSecond: median(wallRates),
    evaluationsPerSolve: evaluations / CASES_PER_SHAPE,
    failures,
  };
}

// ----------------------------------------------------------------------------------------------------------------
// The plain bisection baseline

function conveyanceCubed(section: SectionGeometry, depthM: number): number {
  const areaM2 = section.areaM2(depthM);
  const areaTimesRadius = areaM2 * (areaM2 / section.wettedPerimeterM(depthM));
  return areaTimesRadius * areaTimesRadius * areaM2;
}

function sectionFactorSquared(section: SectionGeometry, depthM: number): number {
  const areaM2 = section.areaM2(depthM);
  return areaM2 * areaM2 * (areaM2 / section.topWidthM(depthM));
}

/**
 * Bisection on F(y) = target, F = X^power with the tolerance on X: the same acceptance test as the engine. The
 * bracket is [0, upper] for a conduit, else grown from [0, 1 m] by doubling.
 */
function bisect(
  evaluate: (section: SectionGeometry, depthM: number) => number,
  section: SectionGeometry,
  target: number,
  power: number,
  upperDepthM: number | undefined,
): { converged: boolean; evaluations: number } {
  const acceptLow = (1 - DEPTH_SOLVE_RELATIVE_TOLERANCE) ** power;
  const acceptHigh = (1 + DEPTH_SOLVE_RELATIVE_TOLERANCE) ** power;
  let evaluations = 0;
  let lowerM = 0;
  let upperM = upperDepthM ?? 1;
  if (upperDepthM === undefined) {
    for (;;) {
      const ratio = evaluate(section, upperM) / target;
      evaluations++;
      if (ratio >= acceptLow && ratio <= acceptHigh) return { converged: true, evaluations };
      if (ratio > 1) break;
      lowerM = upperM;
      upperM *= 2;
      if (evaluations > 2000) return { converged: false, evaluations };
    }
  }
  for (let step = 0; step < 200; step++) {
    const middleM = (lowerM + upperM) / 2;
    const ratio = evaluate(section, middleM) / target;
    evaluations++;
    if (ratio >= acceptLow && ratio <= acceptHigh) return { converged: true, evaluations };
    if (ratio < 1) lowerM = middleM;
    else upperM = middleM;
    if (upperM - lowerM <= 2 * Number.EPSILON * upperM) return { converged: true, evaluations };
  }
  return { converged: false, evaluations };
}

// ----------------------------------------------------------------------------------------------------------------
// Cases

function buildCaseSets(): CaseSet[] {
  const random = seededRandom(20_240_601);
  const uniform = (low: number, high: number): number => low + (high - low) * random();
  const logUniform = (low: number, high: number): number => Math.exp(uniform(Math.log(low), Math.log(high)));
  const sectionsOf = (make: () => SectionGeometry): SectionGeometry[] => Array.from({ length: SECTIONS_PER_SHAPE }, make);
  const flows = (
    sections: readonly SectionGeometry[],
    discharge: (section: SectionGeometry, manningN: number, bedSlope: number) => number,
    roughness: () => number,
    slope: () => number,
  ): Pick<CaseSet, 'dischargeM3s' | 'manningN' | 'bedSlope'> => {
    const dischargeM3s = new Float64Array(CASES_PER_SHAPE);
    const manningN = new Float64Array(CASES_PER_SHAPE);
    const bedSlope = new Float64Array(CASES_PER_SHAPE);
    for (let i = 0; i < CASES_PER_SHAPE; i++) {
      manningN[i] = roughness();
      bedSlope[i] = slope();
      dischargeM3s[i] = discharge(sections[i % SECTIONS_PER_SHAPE]!, manningN[i]!, bedSlope[i]!);
    }
    return { dischargeM3s, manningN, bedSlope };
  };
  const channelFlow = (): number => logUniform(0.05, 100);
  const channelN = (): number => uniform(0.012, 0.045);
  const channelS = (): number => logUniform(0.0005, 0.03);

  const rectangles = sectionsOf(() => rectangleSection({ bottomWidthM: uniform(0.3, 6) }));
  const trapezoids = sectionsOf(() => trapezoidSection({ bottomWidthM: uniform(0.3, 6), leftSideSlopeHV: uniform(1, 4), rightSideSlopeHV: uniform(1, 4) }));
  const triangles = sectionsOf(() => triangleSection({ leftSideSlopeHV: uniform(1, 6), rightSideSlopeHV: uniform(1, 6) }));
  const parabolas = sectionsOf(() => parabolaSection({ topWidthM: uniform(1, 10), atDepthM: uniform(0.3, 1) }));
  const circles = sectionsOf(() => circleSection({ diameterM: uniform(0.3, 2.4) }));
  const fullPipeFlow = (section: SectionGeometry, manningN: number, bedSlope: number): number =>
    (conduitConveyance(section)!.fullConveyanceM83 * Math.sqrt(bedSlope)) / manningN;

  return [
    { shape: 'rectangle', ranges: 'width 0.3-6 m; Q 0.05-100 m3/s (log); n 0.012-0.045; S 0.0005-0.03 (log)', sections: rectangles, ...flows(rectangles, channelFlow, channelN, channelS) },
    { shape: 'trapezoid', ranges: 'bottom 0.3-6 m, sides 1:1-4:1 each; Q 0.05-100 m3/s (log); n 0.012-0.045; S 0.0005-0.03 (log)', sections: trapezoids, ...flows(trapezoids, channelFlow, channelN, channelS) },
    { shape: 'triangle', ranges: 'sides 1:1-6:1 each; Q 0.01-5 m3/s (log); n 0.016-0.045; S 0.0005-0.05 (log)', sections: triangles, ...flows(triangles, () => logUniform(0.01, 5), () => uniform(0.016, 0.045), () => logUniform(0.0005, 0.05)) },
    { shape: 'parabola', ranges: 'top width 1-10 m at 0.3-1 m; Q 0.02-20 m3/s (log); n 0.025-0.05; S 0.0005-0.03 (log)', sections: parabolas, ...flows(parabolas, () => logUniform(0.02, 20), () => uniform(0.025, 0.05), channelS) },
    {
      shape: 'circle',
      ranges: 'diameter 0.3-2.4 m; Q 1%-107% of full-pipe capacity (log); n 0.011-0.015; S 0.0005-0.05 (log)',
      sections: circles,
      ...flows(circles, (section, manningN, bedSlope) => fullPipeFlow(section, manningN, bedSlope) * logUniform(0.01, 1.07), () => uniform(0.011, 0.015), () => logUniform(0.0005, 0.05)),
    },
  ];
}

/** Mulberry32: a small, fast, seeded generator so every run times the same cases. */
function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function formatRate(solvesPerSecond: number): string {
  return Math.round(solvesPerSecond).toLocaleString('en-US');
}

function printTable(header: readonly string[], rows: readonly (readonly string[])[]): void {
  const widths = header.map((title, column) => Math.max(title.length, ...rows.map((row) => row[column]!.length)));
  const line = (cells: readonly string[]): string => cells.map((cell, column) => (column < 2 ? cell.padEnd(widths[column]!) : cell.padStart(widths[column]!))).join('  ');
  console.log(line(header));
  console.log(widths.map((width) => '-'.repeat(width)).join('  '));
  for (const row of rows) console.log(line(row));
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) await run();
