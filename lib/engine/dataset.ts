/**
 * Datasets as the engine sees them (CONTRACT §7.4): the canonical form of an uploaded table and
 * its SHA-256. Pure: parsing and validating the uploaded CSV lives in lib/datasets (it calls
 * back into the engine only to check units); the engine receives canonical datasets keyed by
 * sha256 when it evaluates a sheet that refers to them with `dataset("<sha256>")`.
 */
import { createHash } from 'node:crypto';
import { canonicalJson } from './canonical-json';

export const DATASET_FORMAT = 'denudata-dataset@1';

export type DatasetKind = 'slope_profile' | 'long_profile';
export const DATASET_KINDS: readonly DatasetKind[] = ['slope_profile', 'long_profile'];

/** Column names in canonical order, per kind (CONTRACT §7.1). */
export const DATASET_COLUMNS: Record<DatasetKind, readonly string[]> = {
  slope_profile: ['distance', 'elevation', 'elevation_sd'],
  long_profile: ['distance', 'elevation', 'drainage_area', 'discharge'],
};

export interface DatasetColumn {
  name: string;
  /** The unit text as declared in the header, trimmed and with runs of spaces collapsed. */
  unit: string;
}

/** The canonical form; its RFC 8785 serialisation is hashed. */
export interface DatasetCanonical {
  columns: DatasetColumn[];
  format: typeof DATASET_FORMAT;
  kind: DatasetKind;
  /** Rows in file order, numbers in the declared units, columns in canonical order. */
  rows: number[][];
}

/** Canonical datasets available to one evaluation, keyed by lowercase hex sha256. */
export type DatasetLookup = ReadonlyMap<string, DatasetCanonical>;

export const SHA256_PATTERN = /^[0-9a-f]{64}$/;

/** The RFC 8785 text of a canonical dataset (the bytes that `?format=canonical` serves). */
export function canonicalDatasetJson(dataset: DatasetCanonical): string {
  return canonicalJson(dataset);
}

/** Lowercase hex SHA-256 of the canonical dataset's RFC 8785 UTF-8 bytes. */
export function hashDataset(dataset: DatasetCanonical): string {
  return createHash('sha256').update(canonicalDatasetJson(dataset), 'utf8').digest('hex');
}
