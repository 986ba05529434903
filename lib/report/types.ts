/**
 * The shape of a calculation report and its fixed words (banner, caution, review states), shared by
 * the model, the print page, the PDF and the CSV files.
 */
import type { SheetDocument, SheetResults } from '@/lib/engine';
import { STANDING_CAUTION } from '@/lib/engine/block-type';
import type { FigureModel } from './figure';
import type { PublicUser } from '@/lib/db/users';

export type ReviewStatusName = 'unsigned' | 'in_review' | 'checked' | 'approved' | 'returned';
export type ReviewActionName = 'request' | 'check' | 'return' | 'approve';

/** A person as the report names them (the one person type, narrowed to the name). */
export type ReportPerson = Pick<PublicUser, 'name'>;

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
