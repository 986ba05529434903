/**
 * The calculation report of a revision: one model, built from the revision, its results, the block
 * registry, the review trail and the verification run, and drawn three ways (the print page, the PDF
 * and the CSV files). Pure: the caller loads and evaluates; this only arranges.
 */
import type { BlockTypeInfo, SheetDocument, SheetResults } from '@/lib/engine';
import { STANDING_CAUTION } from '@/lib/engine/block-type';
import { formatNumber } from '@/lib/sheet/format';
import { buildFigure, type FigureModel } from './figure';
import type { EvaluatedInput } from './inputs';
import { verificationLine, type VerificationRun } from './verification';

export type ReviewStatusName = 'unsigned' | 'in_review' | 'checked' | 'approved' | 'returned';
export type ReviewActionName = 'request' | 'check' | 'return' | 'approve';

export interface ReportPerson {
  name: string;
}

/** One review action with its note, as the trail holds it. */
export interface ReviewTrailEntry {
  action: ReviewActionName;
  by: ReportPerson | null;
  at: string;
  message: string;
}

export interface ReportRevisionInput {
  number: number;
  hash: string;
  engineVersion: string;
  message: string;
  createdAt: string;
  author: ReportPerson | null;
  document: SheetDocument;
  results: SheetResults;
  review: {
    status: ReviewStatusName;
    checkedBy: ReportPerson | null;
    checkedAt: string | null;
    approvedBy: ReportPerson | null;
    approvedAt: string | null;
  };
}

export interface SignOffRow {
  role: 'Prepared by' | 'Checked by' | 'Approved by';
  name: string | null;
  at: string | null;
  note: string;
}

export interface ReportOutput {
  name: string;
  label: string;
  /** The value as displayed (six significant figures) with its unit. */
  value: string;
  unit: string;
  si: string;
  siUnit: string;
  /** The recorded spread (CONTRACT §8.5), always with its method label. */
  spread: ReportSpread | null;
  /** The same output by the other method, recomputed for comparison (a Monte Carlo sheet also shows the linear interval). */
  alternative: ReportSpread | null;
}

export interface ReportSpread {
  method: 'monte_carlo' | 'linear';
  label: string;
  /** "95 % interval 10.2 … 31.4 kyr (median 17.9 kyr)" or, for a text output, the counts per label. */
  text: string;
  p2_5: string;
  p50: string;
  p97_5: string;
  /** Spearman sensitivities (Monte Carlo) or contributions (linear), largest first, as "K 0.98". */
  drivers: string;
}

export interface ReportInput {
  name: string;
  label: string;
  written: string;
  /** Value and unit as the current engine evaluates it; a message when it cannot. */
  evaluated: string;
}

export interface ReportBlock {
  id: string;
  name: string;
  type: string;
  typeTitle: string;
  note: string | null;
  formula: string | null;
  inputs: ReportInput[];
  outputs: ReportOutput[];
  status: 'ok' | 'error' | 'blocked' | 'note';
  error: string | null;
  warnings: string[];
  validity: string[];
  cautions: string[];
  /** Numbers in the reference list. */
  sources: number[];
  verification: string | null;
  figures: FigureModel[];
}

export interface ReportSource {
  number: number;
  text: string;
  /** Block type titles that rest on it. */
  usedBy: string[];
}

export interface ReportDifference {
  block: string;
  output: string;
  recorded: string;
  computed: string;
}

export interface ReportModel {
  sheetId: string;
  title: string;
  site: { name: string; latitude?: number; longitude?: number; notes?: string } | null;
  team: string;
  revision: { number: number; hash: string; shortHash: string; message: string; createdAt: string; author: string | null };
  engine: { recorded: string; current: string; changed: boolean };
  generatedAt: string;
  status: ReviewStatusName;
  statusWords: string;
  approved: boolean;
  /** Shown on every page of a revision that is not approved. */
  banner: string | null;
  signOff: SignOffRow[];
  trail: ReviewTrailEntry[];
  differences: ReportDifference[];
  /** Outputs differ, or the engine version differs: the cover says so. */
  recomputeNotice: string | null;
  generalCaution: string;
  blocks: ReportBlock[];
  sources: ReportSource[];
  verification: { engine: string; lines: { typeTitle: string; line: string; pass: boolean }[] };
  /** The sheet's uncertainty settings and its declared distributions, when it has any. */
  uncertainty: { method: string; inputs: string[]; note: string } | null;
}

export const NOT_APPROVED_BANNER = 'Not approved: for checking only';

export const GENERAL_CAUTION =
  'The results in this report are estimates from published, simplified methods under their stated assumptions and validity limits, ' +
  'which are listed with each block. They are not a substitute for site investigation or engineering judgement. ' +
  STANDING_CAUTION;

export const STATUS_WORDS: Record<ReviewStatusName, string> = {
  unsigned: 'Not yet sent for review',
  in_review: 'Awaiting a check',
  checked: 'Checked, awaiting approval',
  approved: 'Approved',
  returned: 'Returned for changes',
};

/** Relative tolerance for "the current engine gives the same output" (CONTRACT §6b). */
export const RECOMPUTE_TOLERANCE = 1e-12;

export const shown = (value: number | string) => (typeof value === 'number' ? formatNumber(value) : value);
const withUnit = (value: number | string, unit: string) => (unit ? `${shown(value)} ${unit}` : shown(value));

type Spread = {
  method?: string;
  samples?: number;
  seed?: number;
  p2_5?: number;
  p50?: number;
  p97_5?: number;
  counts?: Record<string, number>;
  sensitivity?: Record<string, number>;
  contributions?: Record<string, number>;
};

const groupDigits = (n: number) => String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ' ');

/** The label every spread travels with (CONTRACT §8.5). */
export function spreadLabel(spread: Spread): string {
  if (spread.method === 'linear') return 'linear (first order), normal approximation';
  const samples = spread.samples !== undefined ? String(spread.samples).replace(/\B(?=(\d{3})+(?!\d))/g, ' ') : '?';
  return `Monte Carlo, N = ${samples}, seed ${spread.seed ?? '?'}`;
}

/** The interval of a spread as the report prints it, never without its label. */
export function spreadOf(output: { unit: string; spread?: unknown } | undefined): ReportSpread | null {
  const spread = output?.spread as Spread | undefined;
  if (!spread) return null;
  const method = spread.method === 'linear' ? 'linear' : 'monte_carlo';
  const label = spreadLabel(spread);
  const unit = output!.unit ? ` ${output!.unit}` : '';
  if (spread.counts) {
    const counts = Object.entries(spread.counts).map(([name, n]) => `${name} ${groupDigits(n)}`).join(', ');
    return { method, label, text: `samples by result: ${counts}`, p2_5: '', p50: '', p97_5: '', drivers: '' };
  }
  if (typeof spread.p2_5 !== 'number' || typeof spread.p97_5 !== 'number') return null;
  const p2_5 = shown(spread.p2_5);
  const p97_5 = shown(spread.p97_5);
  const p50 = typeof spread.p50 === 'number' ? shown(spread.p50) : '';
  const weights = spread.sensitivity ?? spread.contributions ?? {};
  const drivers = Object.entries(weights)
    .sort((a, b) => Math.abs(b[1]) - Math.abs(a[1]))
    .slice(0, 6)
    .map(([name, w]) => `${name} ${shown(Number(w.toPrecision(2)))}`)
    .join(', ');
  const median = p50 && method === 'monte_carlo' ? ` (median ${p50}${unit})` : '';
  return { method, label, text: `95 % interval ${p2_5} … ${p97_5}${unit}${median}`, p2_5, p50, p97_5, drivers };
}

/** Parameters in the order of the call's arguments (CONTRACT §8.1): normal(mean, sd), lognormal(median, factor), … */
const ARGUMENT_ORDER = ['mean', 'median', 'lo', 'mode', 'hi', 'sd', 'factor'];
const argumentRank = (name: string) => (ARGUMENT_ORDER.includes(name) ? ARGUMENT_ORDER.indexOf(name) : ARGUMENT_ORDER.length);

function differs(a: number | string, b: number | string): boolean {
  if (typeof a !== 'number' || typeof b !== 'number') return a !== b;
  if (a === b) return false;
  return Math.abs(a - b) > RECOMPUTE_TOLERANCE * Math.max(Math.abs(a), Math.abs(b));
}

/** Outputs whose current value differs from the recorded one (and blocks whose status changed). */
export function compareResults(recorded: SheetResults, current: SheetResults): ReportDifference[] {
  const differences: ReportDifference[] = [];
  const names = new Set([...Object.keys(recorded.blocks), ...Object.keys(current.blocks)]);
  for (const block of names) {
    const before = recorded.blocks[block];
    const after = current.blocks[block];
    if (!before || !after || before.status !== after.status) {
      differences.push({ block, output: '', recorded: before?.status ?? 'absent', computed: after?.status ?? 'absent' });
      continue;
    }
    const outputs = new Set([...Object.keys(before.outputs), ...Object.keys(after.outputs)]);
    for (const output of outputs) {
      const r = before.outputs[output];
      const c = after.outputs[output];
      if (!r || !c || differs(r.si, c.si) || r.unit !== c.unit) {
        differences.push({
          block,
          output,
          recorded: r ? withUnit(r.value, r.unit) : 'absent',
          computed: c ? withUnit(c.value, c.unit) : 'absent',
        });
      }
    }
  }
  return differences;
}

function lastNote(trail: ReviewTrailEntry[], action: ReviewActionName): string {
  for (let i = trail.length - 1; i >= 0; i -= 1) if (trail[i]!.action === action) return trail[i]!.message;
  return '';
}

export function buildReport({
  sheetId,
  team,
  revision,
  trail,
  current,
  catalog,
  verification,
  generatedAt,
}: {
  sheetId: string;
  team: string;
  revision: ReportRevisionInput;
  trail: ReviewTrailEntry[];
  /** `alternative`: the results by the other uncertainty method, for comparison (optional). */
  current: { results: SheetResults; inputs: Record<string, Record<string, EvaluatedInput>>; alternative?: SheetResults | null };
  catalog: BlockTypeInfo[];
  verification: VerificationRun;
  generatedAt: string;
}): ReportModel {
  const types = new Map(catalog.map((t) => [t.id, t]));
  const document = revision.document;
  const stored = revision.results;

  // Sources, numbered in order of first use.
  const sources: ReportSource[] = [];
  const sourceNumber = new Map<string, number>();
  const citeType = (type: BlockTypeInfo | undefined): number[] => {
    if (!type) return [];
    return type.sources.map((text) => {
      let number = sourceNumber.get(text);
      if (number === undefined) {
        number = sources.length + 1;
        sourceNumber.set(text, number);
        sources.push({ number, text, usedBy: [] });
      }
      const entry = sources[number - 1]!;
      if (!entry.usedBy.includes(type.title)) entry.usedBy.push(type.title);
      return number;
    });
  };

  // Declared distributions (CONTRACT §8.1), as the recorded results echo them: "lognormal: median 1.1 m^2/kyr, factor 1.5".
  const distributions = new Map<string, string>();
  for (const input of stored.uncertainty?.inputs ?? []) {
    const parameters = Object.entries(input.parameters)
      .sort(([a], [b]) => argumentRank(a) - argumentRank(b))
      .map(([p, v]) => `${p} ${withUnit(v.value, v.unit)}`);
    distributions.set(`${input.block}.${input.input}`, `${input.distribution}: ${parameters.join(', ')}`);
  }

  const blocks: ReportBlock[] = document.blocks.map((block) => {
    const type = types.get(block.type);
    const typeTitle = type?.title ?? block.type;
    if (block.type === 'note') {
      return {
        id: block.id, name: block.name, type: block.type, typeTitle, note: block.note ?? null, formula: null, inputs: [], outputs: [],
        status: 'note', error: null, warnings: [], validity: [], cautions: [], sources: [], verification: null, figures: [],
      };
    }
    const result = stored.blocks[block.name];
    const evaluated = current.inputs[block.name] ?? {};
    const specs = new Map((type?.inputs ?? []).map((i) => [i.name, i]));
    const inputNames = type && !type.freeInputs && type.id !== 'formula'
      ? [...type.inputs.map((i) => i.name).filter((n) => n in block.inputs || specs.get(n)?.default !== undefined), ...Object.keys(block.inputs).filter((n) => !specs.has(n))]
      : Object.keys(block.inputs);
    const inputs: ReportInput[] = inputNames.map((name) => {
      const spec = specs.get(name);
      const written = block.inputs[name] ?? '';
      const value = evaluated[name];
      const declared = distributions.get(`${block.name}.${name}`);
      let shownValue: string;
      if (declared) shownValue = declared;
      else if (written.trim() === '') shownValue = spec?.default !== undefined ? `default ${spec.default}` : spec?.optional ? 'left out' : 'empty';
      else if (!value) shownValue = 'not evaluated';
      else if (value.ok && 'dataset' in value) shownValue = `dataset ${value.dataset.slice(0, 12)}… (pinned by SHA-256)`;
      else if (value.ok) shownValue = withUnit(value.value.value, value.value.unit);
      else shownValue = `not evaluated: ${value.message}`;
      return { name, label: spec?.label ?? name, written: written.trim() === '' ? '(empty)' : written, evaluated: shownValue };
    });
    const outputSpecs = new Map((type?.outputs ?? []).map((o) => [o.name, o]));
    const outputs: ReportOutput[] = Object.entries(result?.outputs ?? {}).map(([name, output]) => ({
      name,
      label: outputSpecs.get(name)?.label ?? name,
      value: shown(output.value),
      unit: output.unit,
      si: shown(output.si),
      siUnit: output.siUnit,
      spread: spreadOf(output),
      alternative: spreadOf(current.alternative?.blocks[block.name]?.outputs[name]),
    }));
    const seriesSpecs = new Map((type?.series ?? []).map((s) => [s.name, s]));
    const figures = Object.entries(result?.series ?? {}).map(([name, series]) => {
      const figure = buildFigure(name, series);
      const label = seriesSpecs.get(name)?.label;
      return label ? { ...figure, title: label } : figure;
    });
    return {
      id: block.id,
      name: block.name,
      type: block.type,
      typeTitle,
      note: block.note ?? null,
      formula: type?.formula.text ?? null,
      inputs,
      outputs,
      status: result?.status ?? 'error',
      error: result?.error ?? (result ? null : 'no stored result for this block'),
      warnings: result?.warnings ?? [],
      validity: type?.validity ?? [],
      // The standing caution every type carries is printed once, on the cover (GENERAL_CAUTION says the same).
      cautions: (type?.cautions ?? []).filter((c) => c !== STANDING_CAUTION),
      sources: citeType(type),
      verification: verificationLine(verification, block.type),
      figures,
    };
  });

  const differences = compareResults(stored, current.results);
  const engineChanged = revision.engineVersion !== current.results.engine;
  const notices: string[] = [];
  if (engineChanged) notices.push(`This revision was calculated with engine ${revision.engineVersion}; the engine is now ${current.results.engine}.`);
  if (differences.length) {
    notices.push(`Recalculated with engine ${current.results.engine}, ${differences.length} output${differences.length === 1 ? '' : 's'} differ from the recorded results (both are shown below); the report shows the recorded results.`);
  } else if (engineChanged) {
    notices.push(`Recalculated with engine ${current.results.engine}, every output agrees with the recorded results.`);
  }

  const review = revision.review;
  const signOff: SignOffRow[] = [
    { role: 'Prepared by', name: revision.author?.name ?? null, at: revision.createdAt, note: lastNote(trail, 'request') || revision.message },
    { role: 'Checked by', name: review.checkedBy?.name ?? null, at: review.checkedAt, note: review.checkedBy ? lastNote(trail, 'check') : '' },
    { role: 'Approved by', name: review.approvedBy?.name ?? null, at: review.approvedAt, note: review.approvedBy ? lastNote(trail, 'approve') : '' },
  ];

  const echo = stored.uncertainty;
  const uncertainty = echo
    ? {
        method: spreadLabel({ method: echo.method, samples: echo.samples, seed: echo.seed }),
        inputs: echo.inputs.map((i) => `${i.block}.${i.input}: ${distributions.get(`${i.block}.${i.input}`) ?? i.distribution}`),
        note:
          'Values are nominal (every distribution at its median); each spread gives its 95 % interval with the method that made it. ' +
          (echo.method === 'linear'
            ? 'The linear method assumes a normal output and is blind to skew: its interval can be misleading for strongly curved relations.'
            : current.alternative
              ? 'The linear (first-order) interval is shown beside the Monte Carlo one for comparison.'
              : ''),
      }
    : null;

  const typesUsed = [...new Set(document.blocks.map((b) => b.type))].filter((id) => id !== 'note');
  const approved = review.status === 'approved';
  return {
    sheetId,
    title: document.title,
    site: document.site ?? null,
    team,
    revision: {
      number: revision.number,
      hash: revision.hash,
      shortHash: revision.hash.slice(0, 12),
      message: revision.message,
      createdAt: revision.createdAt,
      author: revision.author?.name ?? null,
    },
    engine: { recorded: revision.engineVersion, current: current.results.engine, changed: engineChanged },
    generatedAt,
    status: review.status,
    statusWords: STATUS_WORDS[review.status],
    approved,
    banner: approved ? null : NOT_APPROVED_BANNER,
    signOff,
    trail,
    differences,
    recomputeNotice: notices.length ? notices.join(' ') : null,
    generalCaution: GENERAL_CAUTION,
    blocks,
    sources,
    uncertainty,
    verification: {
      engine: verification.engine,
      lines: typesUsed.map((id) => {
        const title = types.get(id)?.title ?? id;
        const line = verificationLine(verification, id);
        const found = verification.cases.find((c) => c.type === id);
        return { typeTitle: title, line: line ?? 'no published worked example for this type (checked by the tests of the engine)', pass: found ? found.pass : true };
      }),
    },
  };
}

export { reportTime } from './time';
