import '../../language/polyfills/object-group-by.cjs'; // Object.groupBy for chevrotain 13 on Node 20: before Langium.
/**
 * Document-scale speed of the language server: what one edit costs in a design of 50, 500 and 5,000 reaches with 3
 * design flows. Run with `npm run bench` (all bench modules) or `npm run bench -- documents`
 * (from a bundle, as the code ships: run-all.ts; `npx tsx test/bench/documents.ts` runs the sources, slower).
 *
 * In process (the server's own services, no connection), after one edit to a reach's slope, median of the timed
 * edits, in CPU time of this process (the machine is shared: CPU time is what the work costs, wall time also
 * counts waiting for a processor; both are printed for the total):
 * - parse and link: Langium's update of the edited document with validation switched off;
 * - our own work, each part alone, on that version: the analysis (with the previous version's channel results and
 *   profiles at hand, as in the server: analysis/channel-memo.ts), the validation checks with the analysis cached
 *   (diagnostics), and the inlay hints of the whole document; their sum is the budget figure (under 50 ms at 500
 *   reaches on this machine, issue 4), and the analysis should take under a quarter of parse and link (issue 8).
 *   Editors ask for the hints of the visible lines only: the hints of a 60-line window are printed too;
 * - of the analysis, the reach computations the edit could not take over from the previous version (flow
 *   descriptions, marches and junction balances of the reaches its effect reaches: hydraulics/profile/reach-reuse.ts),
 *   how many and their wall time: what any analysis of that edit must compute, the floor under the analysis figure;
 * - the analysis of the whole design from scratch (nothing remembered), as when a design is first opened;
 * - validation and edit to diagnostics: Langium's update with validation, as the server runs it;
 * - hover on a reach name (budget under 5 ms).
 * `RUNNEL_BENCH_SIZES=500 npm run bench -- documents` measures only the sizes given.
 * Over the protocol (the bundled server over stdio): from sending `didChange` to receiving the diagnostics of that
 * version, the whole loop an editor sees.
 *
 * The designs are generated: channels of 50 reaches cycling trapezoid, rectangle, V and pipe sections with grass,
 * riprap and concrete linings, each reach 100-300 ft long on a 0.2-3 % slope; flows 10, 25 and 100 cfs (the
 * numbers only exercise the code and are not a design).
 */
import { cpus, loadavg } from 'node:os';
import { performance } from 'node:perf_hooks';
import { pathToFileURL } from 'node:url';
import { DocumentState, URI, type LangiumDocument } from 'langium';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { analyzeDocument, forgetAnalysis } from '../../language/analysis/analyze-design.js';
import { LspWorkspace } from '../server/lsp-workspace.js';
import { TestLanguageClient, pathToUri } from '../server/lsp-client.js';
import { NO_CRITERIA_DEFAULTS } from '../../language/analysis/criteria-settings.js';
import { reachComputationCounts } from '../../language/analysis/channel-profiles.js';

const SIZES = (process.env.RUNNEL_BENCH_SIZES?.split(",").map(Number) ?? [50, 500, 5_000]) as readonly number[];
const REACHES_PER_CHANNEL = 50;
/**
 * Edits timed and edits before them, by design size. The first edits of a session run before the JIT has compiled
 * the per-edit code and while the heap is still growing: at 50 reaches the medians of successive windows of 31
 * edits from the first fell from 12.4 to 8.5, 7.4 and then about 4 ms of analysis (parse and link from 9.7 to
 * about 5 ms) and stayed there; they settle after about 90 edits, a few minutes of typing. So 31 are timed after 90
 * (30 had been used before, which timed the end of the warm-up). The 5,000-reach design takes about a second per
 * edit, so it keeps 15 after 15.
 */
function editCounts(reaches: number): { readonly timed: number; readonly warmUp: number } {
  return reaches >= 5_000 ? { timed: 15, warmUp: 15 } : { timed: 31, warmUp: 90 };
}
const TIMED_HOVERS = 200;

/** A generated design of `reaches` reaches and 3 flows (see the module comment). */
export function generatedDesign(reaches: number): string {
  const lines = [
    `design "Generated design, ${reaches} reaches"`,
    'units US',
    'criteria {\n  freeboard 0.5 ft\n  minimum velocity 2 ft/s\n}',
    'section ditch trapezoid {\n  bottom width 3 ft\n  side slopes 3:1\n  bank height 2.5 ft\n}',
    'section lined rectangle {\n  bottom width 4 ft\n  bank height 3 ft\n}',
    'section vee triangle {\n  side slopes 4:1, 3:1\n  bank height 2 ft\n}',
    'section pipe circle {\n  diameter 36 in\n}',
    'lining grass {\n  n 0.035\n  permissible shear 1.0 psf\n}',
    'lining riprap {\n  n 0.033\n  permissible shear 4.0 psf\n}',
    'lining concrete {\n  n 0.013\n  permissible velocity 15 ft/s\n}',
    'flows {\n  q10  = 10 cfs  "10-year"\n  q25  = 25 cfs  "25-year"\n  q100 = 60 cfs "100-year"\n}',
  ];
  const sections = ['ditch', 'lined', 'vee', 'pipe'];
  const linings = ['grass', 'riprap', 'concrete', 'concrete'];
  for (let channel = 0; channel * REACHES_PER_CHANNEL < reaches; channel++) {
    lines.push(`channel c${channel} {`);
    for (let index = 0; index < REACHES_PER_CHANNEL && channel * REACHES_PER_CHANNEL + index < reaches; index++) {
      const number = channel * REACHES_PER_CHANNEL + index;
      const kind = number % sections.length;
      const slopePercent = (0.2 + ((number * 37) % 280) / 100).toFixed(2);
      const lengthFt = 100 + ((number * 53) % 200);
      lines.push(`  reach r${number} {`, `    section ${sections[kind]}`, `    lining ${linings[kind]}`, `    slope ${slopePercent} %`, `    length ${lengthFt} ft`, '  }');
    }
    lines.push('  outlet free fall', '}');
  }
  return `${lines.join('\n')}\n`;
}

/** CPU time of this process so far, ms (user + system, all threads). */
function cpuNowMs(): number {
  const usage = process.cpuUsage();
  return (usage.user + usage.system) / 1000;
}

function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? (sorted[middle] ?? Number.NaN) : ((sorted[middle - 1] ?? 0) + (sorted[middle] ?? 0)) / 2;
}

const ms = (value: number): string => `${value < 10 ? value.toFixed(2) : value.toFixed(1)} ms`;

interface InProcessFigures {
  readonly reaches: number;
  readonly parseAndLinkMs: number;
  readonly validationMs: number;
  readonly editToDiagnosticsMs: number;
  readonly editToDiagnosticsWallMs: number;
  readonly analysisMs: number;
  /** Of the analysis: the reach computations the edit could not take over (how many, and their time). */
  readonly recomputed: number;
  readonly recomputedMs: number;
  readonly wholeAnalysisMs: number;
  readonly diagnosticsMs: number;
  readonly hintsMs: number;
  readonly windowHintsMs: number;
  readonly hoverMs: number;
  readonly diagnostics: number;
  readonly hints: number;
}

/** The edit: the slope of reach r{n} toggles between two values, so every edit changes the results. */
function editedText(text: string, reach: number, round: number): string {
  return text.replace(new RegExp(`(reach r${reach} \\{\\n[^}]*?slope )[\\d.]+ %`), `$1${round % 2 === 0 ? '1.35' : '0.85'} %`);
}

async function measureInProcess(reaches: number): Promise<InProcessFigures> {
  const { timed: TIMED_EDITS, warmUp: WARM_UP_EDITS } = editCounts(reaches);
  const workspace = await LspWorkspace.create();
  const { shared, Runnel } = workspace.services;
  const builder = shared.workspace.DocumentBuilder;
  const name = `generated-${reaches}.runnel`;
  const base = generatedDesign(reaches);
  const [document] = await workspace.set({ [name]: base });
  if (document === undefined) throw new Error('no document');
  const uri = document.uri.toString();
  const hintProvider = Runnel.lsp.InlayHintProvider;
  const hoverProvider = Runnel.lsp.HoverProvider;
  const validator = Runnel.validation.DocumentValidator;
  if (hintProvider === undefined || hoverProvider === undefined) throw new Error('providers missing');
  const wholeRange = { start: { line: 0, character: 0 }, end: document.textDocument.positionAt(base.length) };
  const edited = Math.floor(reaches / 2);
  let version = 1;
  const applyEdit = async (round: number): Promise<void> => {
    version++;
    shared.workspace.TextDocuments.set(TextDocument.create(uri, 'runnel', version, editedText(base, edited, round)));
    await builder.update([URI.parse(uri)], []);
  };

  // Our own work, each part alone: the edit is parsed and linked without validation, then the analysis of the new
  // version is computed (with the previous version's channels and profiles at hand, as in the server), then the
  // validation checks with that analysis cached (diagnostics), then the inlay hints of the whole document.
  const parseAndLink: number[] = [];
  const analysis: number[] = [];
  const recomputed: number[] = [];
  const recomputedMs: number[] = [];
  const diagnostics: number[] = [];
  const hints: number[] = [];
  let hintCount = 0;
  const validationOptions = builder.updateBuildOptions;
  builder.updateBuildOptions = { ...validationOptions, validation: false };
  try {
    for (let round = 0; round < TIMED_EDITS + WARM_UP_EDITS; round++) {
      const start = cpuNowMs();
      await applyEdit(round);
      const linked = cpuNowMs();
      const current = workspace.document(uri);
      const countsBefore = { ...reachComputationCounts(current) };
      analyzeDocument(current, NO_CRITERIA_DEFAULTS);
      const analysed = cpuNowMs();
      const countsAfter = reachComputationCounts(current);
      await validator.validateDocument(current, { validation: { categories: ['built-in', 'fast'] } } as never);
      const validated = cpuNowMs();
      const shown = await hintProvider.getInlayHints(current, { textDocument: { uri }, range: wholeRange });
      const hinted = cpuNowMs();
      hintCount = shown?.length ?? 0;
      if (round >= WARM_UP_EDITS) {
        parseAndLink.push(linked - start);
        analysis.push(analysed - linked);
        recomputed.push((countsAfter?.computed ?? Number.NaN) - (countsBefore.computed ?? 0));
        recomputedMs.push((countsAfter?.computedMs ?? Number.NaN) - (countsBefore.computedMs ?? 0));
        diagnostics.push(validated - analysed);
        hints.push(hinted - validated);
      }
    }
  } finally {
    builder.updateBuildOptions = validationOptions;
  }

  // The analysis of the whole design from scratch (nothing remembered), as when a design is first opened.
  const wholeAnalysis: number[] = [];
  for (let round = 0; round < Math.max(3, Math.ceil(TIMED_EDITS / 3)); round++) {
    const current = workspace.document(uri);
    forgetAnalysis(current, { everything: true });
    const start = cpuNowMs();
    analyzeDocument(current, NO_CRITERIA_DEFAULTS);
    wholeAnalysis.push(cpuNowMs() - start);
  }

  // The whole loop as the server runs it: update with validation (the analysis computed inside it).
  const phaseWall = new Map<DocumentState, number>();
  const phaseCpu = new Map<DocumentState, number>();
  for (const state of [DocumentState.IndexedReferences, DocumentState.Validated]) {
    builder.onDocumentPhase(state, (built) => {
      if (built.uri.toString() !== uri) return;
      phaseWall.set(state, performance.now());
      phaseCpu.set(state, cpuNowMs());
    });
  }
  const validation: number[] = [];
  const editToDiagnostics: number[] = [];
  const editToDiagnosticsWall: number[] = [];
  for (let round = 0; round < TIMED_EDITS + WARM_UP_EDITS; round++) {
    phaseWall.clear();
    phaseCpu.clear();
    const startWall = performance.now();
    const start = cpuNowMs();
    await applyEdit(round + 1);
    if (round < WARM_UP_EDITS) continue;
    const linked = phaseCpu.get(DocumentState.IndexedReferences) ?? Number.NaN;
    const validated = phaseCpu.get(DocumentState.Validated) ?? Number.NaN;
    validation.push(validated - linked);
    editToDiagnostics.push(validated - start);
    editToDiagnosticsWall.push((phaseWall.get(DocumentState.Validated) ?? Number.NaN) - startWall);
  }

  const current = workspace.document(uri);
  const hoverLine = current.textDocument.getText().split('\n').findIndex((line) => line.includes(`reach r${edited} {`));
  const windowTimes: number[] = [];
  const window = { start: { line: Math.max(0, hoverLine - 30), character: 0 }, end: { line: hoverLine + 30, character: 0 } };
  for (let index = 0; index < TIMED_HOVERS; index++) {
    const start = cpuNowMs();
    await hintProvider.getInlayHints(current, { textDocument: { uri }, range: window });
    windowTimes.push(cpuNowMs() - start);
  }
  const hoverTimes: number[] = [];
  for (let index = 0; index < TIMED_HOVERS; index++) {
    const start = cpuNowMs();
    await hoverProvider.getHoverContent(current, { textDocument: { uri }, position: { line: hoverLine, character: 10 } });
    hoverTimes.push(cpuNowMs() - start);
  }
  return {
    reaches,
    parseAndLinkMs: median(parseAndLink),
    validationMs: median(validation),
    editToDiagnosticsMs: median(editToDiagnostics),
    editToDiagnosticsWallMs: median(editToDiagnosticsWall),
    analysisMs: median(analysis),
    recomputed: median(recomputed),
    recomputedMs: median(recomputedMs),
    wholeAnalysisMs: median(wholeAnalysis),
    diagnosticsMs: median(diagnostics),
    hintsMs: median(hints),
    windowHintsMs: median(windowTimes.slice(10)),
    hoverMs: median(hoverTimes.slice(10)),
    diagnostics: current.diagnostics?.length ?? 0,
    hints: hintCount,
  };
}

/** The editor's loop over stdio: didChange to the diagnostics of that version. */
async function measureOverProtocol(reaches: number): Promise<{ openMs: number; editMs: number }> {
  const { timed: TIMED_EDITS, warmUp: WARM_UP_EDITS } = editCounts(reaches);
  const { client } = await TestLanguageClient.start({ settings: {} });
  try {
    const uri = pathToUri(`/test/bench/generated-${reaches}.runnel`);
    const base = generatedDesign(reaches);
    const openStart = performance.now();
    await client.open(uri, base, 1);
    await client.diagnosticsOfVersion(uri, 1);
    const openMs = performance.now() - openStart;
    const times: number[] = [];
    for (let round = 0; round < TIMED_EDITS + WARM_UP_EDITS; round++) {
      const version = round + 2;
      const start = performance.now();
      await client.replaceText(uri, version, editedText(base, Math.floor(reaches / 2), round));
      await client.diagnosticsOfVersion(uri, version);
      if (round >= WARM_UP_EDITS) times.push(performance.now() - start);
    }
    return { openMs, editMs: median(times) };
  } finally {
    await client.stop();
  }
}

/** Prints the figures; see the module comment for what is measured. */
export async function run(): Promise<void> {
  console.log(`Node ${process.version}, ${cpus().length} CPUs (${cpus()[0]?.model ?? 'unknown'}), load average ${loadavg().map((value) => value.toFixed(2)).join(' ')}`);
  const [small, large] = [editCounts(50), editCounts(5_000)];
  console.log(
    `Median of ${small.timed} edits (slope of the middle reach) after ${small.warmUp} warm-up edits (${large.timed} after ${large.warmUp} from 5,000 reaches); hover and 60-line hints median of ${TIMED_HOVERS - 10}.`,
  );
  console.log('In-process figures are CPU time of this process; "wall" and "stdio" columns are elapsed time.\n');
  const rows: string[][] = [];
  for (const reaches of SIZES) {
    const figures = await measureInProcess(reaches);
    const protocol = await measureOverProtocol(reaches);
    const ours = figures.analysisMs + figures.diagnosticsMs + figures.hintsMs;
    rows.push([
      String(reaches),
      ms(figures.parseAndLinkMs),
      ms(figures.analysisMs),
      (figures.analysisMs / figures.parseAndLinkMs).toFixed(2),
      `${figures.recomputed} / ${ms(figures.recomputedMs)}`,
      ms(figures.diagnosticsMs),
      ms(figures.hintsMs),
      ms(ours),
      ms(figures.windowHintsMs),
      ms(figures.wholeAnalysisMs),
      ms(figures.validationMs),
      ms(figures.editToDiagnosticsMs),
      ms(figures.editToDiagnosticsWallMs),
      ms(protocol.editMs),
      ms(figures.hoverMs),
      `${figures.diagnostics} / ${figures.hints}`,
    ]);
  }
  const headings = [
    'reaches',
    'parse+link',
    'analysis',
    'analysis / parse',
    'of it, reach computations redone (count / wall)',
    'diagnostics',
    'hints',
    'our work',
    'hints, 60 lines',
    'analysis, whole design',
    'validation',
    'edit→diagnostics',
    'edit→diagnostics (wall)',
    'edit→diagnostics (stdio, wall)',
    'hover',
    'diagnostics / hints',
  ];
  console.log(`| ${headings.join(' | ')} |`);
  console.log(`|${headings.map(() => '---:').join('|')}|`);
  for (const row of rows) console.log(`| ${row.join(' | ')} |`);
  console.log('\nBudgets: our work (analysis + diagnostics + hints) under 50 ms, analysis under a quarter of parse+link, hover under 5 ms, at 500 reaches.');
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  await run();
}
