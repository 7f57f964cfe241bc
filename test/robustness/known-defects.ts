/**
 * Defects the fuzzing found in code this suite's author may not change (the engine outside its profile folder, the
 * report renderer), reported to their owners. Each has a reproduction; known-defects.test.ts checks that it is
 * still present, and the fuzz suites set aside problems that match it (and say how many). When an owner fixes one,
 * its test fails: delete the entry here and the fuzzing covers that ground again.
 */
import { analyzeDocument } from '../../language/analysis/analyze-design.js';
import type { DesignAnalysis } from '../../language/analysis/model.js';
import { renderReportHtml } from '../../language/report/report-html.js';
import { buildWorkspace, sampleFiles } from '../language/language-test-kit.js';
import { NO_CRITERIA_DEFAULTS } from '../../language/analysis/criteria-settings.js';

export interface KnownDefect {
  readonly id: string;
  /** Whose code it is in. */
  readonly owner: string;
  readonly summary: string;
  /** Whether a problem sentence of the document harness is this defect. */
  readonly matches: (problem: string) => boolean;
  /** Runs the reproduction; true while the defect is present. */
  readonly present: () => Promise<boolean>;
}

/** The report as a reader sees it: no style block, no data attributes (raw values for scripts). */
function shown(html: string): string {
  return html.replace(/<style[\s\S]*?<\/style>/g, '').replace(/\sdata-[\w-]+="[^"]*"/g, '');
}

/** The report of a sample's analysis after `change` (finite but enormous values put straight into the model). */
async function sampleReport(name: string, change: (analysis: DesignAnalysis) => void): Promise<string> {
  const samples = sampleFiles();
  const { documents } = await buildWorkspace({ [name]: samples[name] ?? '', 'linings.runnel': samples['linings.runnel'] ?? '' });
  const document = documents[0];
  if (document === undefined) throw new Error('no document');
  const analysis = structuredClone(analyzeDocument(document, NO_CRITERIA_DEFAULTS)) as DesignAnalysis;
  change(analysis);
  return shown(renderReportHtml(analysis, { generatedAt: new Date(0), fileName: name }));
}

type Writable<T> = { -readonly [K in keyof T]: T[K] };

export const KNOWN_DEFECTS: readonly KnownDefect[] = [
  {
    id: 'analysis-profile-work-unbounded',
    owner: 'water-surface profiles in the analysis (language/analysis/channel-profiles.ts, language/hydraulics/profile/standard-step.ts)',
    summary:
      'The profile march has no bound on its work that the design cannot raise: (1) steps of at most 100 m under a budget of 5 million ' +
      'steps, so `length 1e9 ft` in a sample takes about a minute to validate and 1e300 ft about 8 s; (2) a very shallow flow (1 L/s ' +
      'over a 50 m wide rectangle on an 11 % slope, critical depth 0.3 mm) is marched in steps of about 0.1 mm: 38,000 points for a ' +
      '2.8 m reach, 3.8 million and 20 s for 278 m. The server stalls that long on each keystroke. While this is open the fuzz suites ' +
      'cannot tell a check made slow by it from any other slow check, so every time-bound problem is set aside (and counted).',
    matches: (problem) => /^(?:took \d+ ms|did not finish within \d+ ms)/.test(problem),
    present: async () => {
      const samples = sampleFiles();
      const longReach = (samples['roadside-ditches.runnel'] ?? '').replace('length 450 ft', 'length 1e7 ft');
      const shallow = [
        'design "Shallow sheet of water"',
        'section wide rectangle { bottom width 50 m  bank height 1 m }',
        'lining smooth { n 0.0286 }',
        'flows { low = 1 L/s }',
        'channel chute {',
        '  reach apron { section wide  lining smooth  slope 11 %  length 2.777 m }',
        '  outlet free fall',
        '}',
      ].join('\n');
      const points = async (files: Record<string, string>): Promise<number> => {
        const { documents } = await buildWorkspace(files);
        const document = documents[0];
        if (document === undefined) throw new Error('no document');
        return analyzeDocument(document, NO_CRITERIA_DEFAULTS).channels.flatMap((channel) => channel.profiles ?? []).reduce((sum, profile) => sum + profile.points.length, 0);
      };
      // A profile is drawn and searched well with a few hundred points; these need tens of thousands.
      const longReachPoints = await points({ 'roadside-ditches.runnel': longReach, 'linings.runnel': samples['linings.runnel'] ?? '' });
      const shallowPoints = await points({ 'shallow.runnel': shallow });
      return longReachPoints > 20_000 || shallowPoints > 10_000;
    },
  },
  {
    id: 'report-drawing-overflow',
    owner: 'report renderer (language/report/longitudinal-svg.ts, rating-curve-svg.ts)',
    summary:
      'Finite but enormous inputs overflow in the drawings: a reach 1.8e308 ft long makes the longitudinal view label a station "Infinity" ' +
      '(the stations add up past the largest double); a bottom width of 1.8e308 m puts "Infinity" into a drawn path.',
    matches: (problem) => /^HTML report shows '(Infinity|NaN)'.*(<path|<line|<text|<polyline|<circle|<rect| d="|points=")/.test(problem),
    present: async () => {
      // Two reaches of 1.7e308 m: their stations add up past the largest double.
      const longitudinal = await sampleReport('roadside-ditches.runnel', (analysis) => {
        for (const reach of analysis.channels[0]?.reaches ?? []) (reach as Writable<typeof reach>).length_m = 1.7e308;
      });
      const crossSection = await sampleReport('irrigation-canal.runnel', (analysis) => {
        const section = analysis.channels[0]?.reaches[1]?.section;
        if (section !== undefined) (section as Writable<typeof section>).dimensions = { ...section.dimensions, bottomWidth_m: 1.7976931348623157e308 };
      });
      return /Infinity|NaN/.test(longitudinal) || /Infinity|NaN/.test(crossSection);
    },
  },
];

/** Splits harness problems into the unknown ones and those of a known defect (by id). */
export function setAsideKnownDefects(problems: readonly string[]): { unknown: string[]; known: Map<string, number> } {
  const unknown: string[] = [];
  const known = new Map<string, number>();
  for (const problem of problems) {
    const defect = KNOWN_DEFECTS.find((candidate) => candidate.matches(problem));
    if (defect === undefined) unknown.push(problem);
    else known.set(defect.id, (known.get(defect.id) ?? 0) + 1);
  }
  return { unknown, known };
}
