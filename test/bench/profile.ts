/**
 * Speed of the water-surface profile: a 10 km channel computed at 1 m steps (10,000 standard steps) should take
 * under 20 ms. Prints, over repeated runs after a warm-up, the median and fastest wall-clock time and the median
 * CPU time of the process (which a busy machine disturbs less), for two channels: one mild reach with a backwater
 * curve (subcritical pass only), and four reaches alternating mild and steep (both passes, two hydraulic jumps).
 * Run through test/bench/run-all.ts, or alone with `npx tsx test/bench/profile.ts`.
 */
import { pathToFileURL } from 'node:url';
import { computeChannelProfile, type ChannelProfileInput } from '../../language/hydraulics/profile/index.js';
import { trapezoidSection } from '../../language/hydraulics/sections/index.js';

const TARGET_MS = 20;
const WARM_UP_RUNS = 5;
const TIMED_RUNS = 30;

const canal = trapezoidSection({ bottomWidthM: 3, leftSideSlopeHV: 2, rightSideSlopeHV: 2 });

/** One mild reach, 10 km, backwater from a high outlet level. */
const backwaterChannel: ChannelProfileInput = {
  reaches: [{ name: 'canal', section: canal, manningN: 0.025, bedSlope: 0.0005, lengthM: 10_000 }],
  dischargeM3s: 12,
  outlet: { kind: 'water-level', elevationM: 3.5 },
  stepControl: { maximumStepLengthM: 1 },
};

/** Mild, steep, mild, steep: 10 km in all, critical depth at both breaks, two jumps. */
const mixedChannel: ChannelProfileInput = {
  reaches: [
    { name: 'upper mild', section: canal, manningN: 0.025, bedSlope: 0.0005, lengthM: 3_000 },
    { name: 'upper chute', section: canal, manningN: 0.016, bedSlope: 0.02, lengthM: 2_000 },
    { name: 'lower mild', section: canal, manningN: 0.025, bedSlope: 0.0005, lengthM: 3_000 },
    { name: 'lower chute', section: canal, manningN: 0.016, bedSlope: 0.02, lengthM: 2_000 },
  ],
  dischargeM3s: 12,
  outlet: { kind: 'water-level', elevationM: 2.5 },
  stepControl: { maximumStepLengthM: 1 },
};

interface Timing {
  readonly medianMs: number;
  readonly fastestMs: number;
  readonly medianCpuMs: number;
  readonly points: number;
  readonly jumps: number;
}

function median(values: number[]): number {
  values.sort((a, b) => a - b);
  return values[Math.floor(values.length / 2)] ?? 0;
}

function timeRuns(input: ChannelProfileInput): Timing {
  let points = 0;
  let jumps = 0;
  for (let run = 0; run < WARM_UP_RUNS; run++) computeChannelProfile(input);
  const wallMs: number[] = [];
  const cpuMs: number[] = [];
  for (let run = 0; run < TIMED_RUNS; run++) {
    const cpuStart = process.cpuUsage();
    const startMs = performance.now();
    const result = computeChannelProfile(input);
    wallMs.push(performance.now() - startMs);
    const cpu = process.cpuUsage(cpuStart);
    cpuMs.push((cpu.user + cpu.system) / 1000);
    if (!result.converged) throw new Error(`bench channel did not converge: ${result.message}`);
    points = result.points.length;
    jumps = result.jumps.length;
  }
  return { medianMs: median(wallMs), fastestMs: Math.min(...wallMs), medianCpuMs: median(cpuMs), points, jumps };
}

export async function run(): Promise<void> {
  for (const [label, input] of [
    ['10 km mild channel, backwater, 1 m steps', backwaterChannel],
    ['10 km mild/steep channel, two jumps, 1 m steps', mixedChannel],
  ] as const) {
    const timing = timeRuns(input);
    const verdict = timing.medianMs < TARGET_MS ? 'within' : 'OVER';
    console.log(
      `water-surface profile, ${label}: median ${timing.medianMs.toFixed(2)} ms (CPU ${timing.medianCpuMs.toFixed(2)} ms), ` +
        `fastest ${timing.fastestMs.toFixed(2)} ms over ${TIMED_RUNS} runs (${timing.points} points, ${timing.jumps} jumps) — ${verdict} the ${TARGET_MS} ms target`,
    );
  }
}

// Allow `npx tsx test/bench/profile.ts` on its own.
if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) await run();
