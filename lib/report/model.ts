/**
 * The calculation report of a revision: one model, built from the revision, its results, the block
 * registry, the review trail and the verification run, and drawn three ways (the print page, the PDF
 * and the CSV files). Pure: the caller loads and evaluates; this only arranges.
 */
import type { BlockTypeInfo, SheetResults } from '@/lib/engine';
import { STANDING_CAUTION } from '@/lib/engine/block-type';
import { buildFigure } from './figure';
import type { EvaluatedInput } from './inputs';
import {
  GENERAL_CAUTION,
  NOT_APPROVED_BANNER,
  STATUS_WORDS,
  type ReportBlock,
  type ReportInput,
  type ReportModel,
  type ReportOutput,
  type ReportRevisionInput,
  type ReviewActionName,
  type ReviewTrailEntry,
  type ReportSource,
  type SignOffRow,
} from './types';
import { compareResults, shown, spreadLabel, spreadOf, withUnit } from './values';
import { verificationLine, type VerificationRun } from './verification';

/** Parameters in the order of the call's arguments (CONTRACT §8.1): normal(mean, sd), lognormal(median, factor), … */
const ARGUMENT_ORDER = ['mean', 'median', 'lo', 'mode', 'hi', 'sd', 'factor'];
const argumentRank = (name: string) => (ARGUMENT_ORDER.includes(name) ? ARGUMENT_ORDER.indexOf(name) : ARGUMENT_ORDER.length);

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