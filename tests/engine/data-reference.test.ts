import { describe, expect, it } from 'vitest';
import { hashDataset, type DatasetCanonical } from '@/lib/engine/dataset';
import { DATA_INPUT_RULE, DatasetReference, parseDataInput, resolveDataset } from '@/lib/engine/dataset-input';
import { engineError } from '../support/engine-error';

// Data references on their own (dataset-input.ts, CONTRACT "Additions" §1 and §7.6): the exact text of a data
// input, the resolution of a hash in the lookup, and the conversion of each column to SI. References: the
// contract's rules for the text and the errors; unit factors from NIST SP 811 (1 km = 1000 m, 1 ft = 0.3048 m
// exactly, 1 km^2 = 10^6 m^2) and the Julian year of 365.25 d (IAU) for m^2/yr; IEEE 754 double range
// (the largest finite double is about 1.8e308) for the overflow case.

const HASH = 'a1'.repeat(32);
const OTHER = 'b2'.repeat(32);

const longProfile = (): DatasetCanonical => ({
  columns: [
    { name: 'distance', unit: 'km' },
    { name: 'elevation', unit: 'ft' },
    { name: 'drainage_area', unit: 'km^2' },
    { name: 'discharge', unit: 'm^2/yr' },
  ],
  format: 'denudata-dataset@1',
  kind: 'long_profile',
  rows: [
    [0, 100, 2, 31_557_600],
    [1.5, 50, 3, 63_115_200],
  ],
});

const refusal = engineError;

describe('the text of a data input (parseDataInput)', () => {
  it('should take exactly dataset("<64 lowercase hex>") with optional white space around the call and inside the parentheses', () => {
    expect(parseDataInput(`dataset("${HASH}")`)).toBe(HASH);
    expect(parseDataInput(`  dataset( "${HASH}" )  `)).toBe(HASH);
    expect(parseDataInput(`\tdataset(\n"${HASH}"\t)\n`)).toBe(HASH);
    for (const text of [
      `dataset ("${HASH}")`,
      `xdataset("${HASH}")`,
      `dataset("${HASH}")x`,
      `dataset("${HASH}") + 1`,
      `dataset("${HASH.toUpperCase()}")`,
      `dataset("${HASH.slice(1)}")`,
      `dataset("${HASH}0")`,
      `dataset('${HASH}')`,
      `dataset(${HASH})`,
      `dataset("g${HASH.slice(1)}")`,
      '',
    ]) {
      expect(parseDataInput(text), text).toBeNull();
    }
    expect(DATA_INPUT_RULE).toBe('must be dataset("<sha256>") with the 64 lowercase hex digits of a dataset of the team');
  });
});

describe('resolving a data input (resolveDataset)', () => {
  it('should convert every column to SI with its declared unit, and keep the declared units', () => {
    const dataset = longProfile();
    const resolved = resolveDataset('data', new DatasetReference(HASH), 'long_profile', new Map([[HASH, dataset]]));
    expect(resolved.sha256).toBe(HASH);
    expect(resolved.kind).toBe('long_profile');
    expect(resolved.count).toBe(2);
    expect(Array.from(resolved.columns.distance!)).toEqual([0, 1500]);
    expect(resolved.columns.elevation![0]).toBeCloseTo(30.48, 12);
    expect(resolved.columns.elevation![1]).toBeCloseTo(15.24, 12);
    expect(Array.from(resolved.columns.drainage_area!)).toEqual([2e6, 3e6]);
    expect(resolved.columns.discharge![0]).toBeCloseTo(1, 12);
    expect(resolved.columns.discharge![1]).toBeCloseTo(2, 12);
    expect(resolved.columns.elevation_sd).toBeUndefined();
    expect(resolved.columns.distance).toBeInstanceOf(Float64Array);
    expect(resolved.declaredUnits).toEqual({ distance: 'km', elevation: 'ft', drainage_area: 'km^2', discharge: 'm^2/yr' });
  });

  it('should convert once per canonical object and hash, and again for the same object under another hash', () => {
    const dataset = longProfile();
    const lookup = new Map([
      [HASH, dataset],
      [OTHER, dataset],
    ]);
    const first = resolveDataset('data', new DatasetReference(HASH), 'long_profile', lookup);
    expect(resolveDataset('other_input', new DatasetReference(HASH), 'long_profile', lookup)).toBe(first);
    const other = resolveDataset('data', new DatasetReference(OTHER), 'long_profile', lookup);
    expect(other.sha256).toBe(OTHER);
    expect(Array.from(other.columns.distance!)).toEqual([0, 1500]);
  });

  it('should refuse an unknown hash, naming the input and the first 12 hex digits', () => {
    for (const lookup of [undefined, new Map([[OTHER, longProfile()]])]) {
      const error = refusal(() => resolveDataset('data', new DatasetReference(HASH), 'long_profile', lookup));
      expect(error.message).toBe(
        `data: dataset ${HASH.slice(0, 12)}… is not available to this sheet (unknown sha256; upload it to the team or check the hash)`,
      );
      expect(error.input).toBe('data');
      expect(error.code).toBe('invalid');
    }
  });

  it('should refuse a dataset of the wrong kind, with what was expected and given', () => {
    const error = refusal(() => resolveDataset('data', new DatasetReference(HASH), 'slope_profile', new Map([[HASH, longProfile()]])));
    expect(error.message).toBe(`data: dataset ${HASH.slice(0, 12)}… is a long_profile, but this input needs a slope_profile`);
    expect([error.input, error.expected, error.given]).toEqual(['data', 'slope_profile', 'long_profile']);
  });

  it('should refuse a column its kind does not allow, a unit of the wrong dimension and a value that overflows in SI', () => {
    const resolve = (dataset: DatasetCanonical) => refusal(() => resolveDataset('data', new DatasetReference(HASH), dataset.kind, new Map([[HASH, dataset]])));
    const short = HASH.slice(0, 12);
    // discharge is a column of long profiles only (CONTRACT §7.1).
    const slope: DatasetCanonical = {
      columns: [{ name: 'distance', unit: 'm' }, { name: 'elevation', unit: 'm' }, { name: 'discharge', unit: 'm^2/s' }],
      format: 'denudata-dataset@1',
      kind: 'slope_profile',
      rows: [[0, 1, 1]],
    };
    expect(resolve(slope).message).toBe(`data: dataset ${short} has a column "discharge" that a slope_profile does not allow`);
    const unknownColumn: DatasetCanonical = { ...slope, columns: [{ name: 'distance', unit: 'm' }, { name: 'colour', unit: 'm' }], rows: [[0, 1]] };
    expect(resolve(unknownColumn).message).toBe(`data: dataset ${short} has a column "colour" that a slope_profile does not allow`);
    const wrongUnit: DatasetCanonical = { ...slope, columns: [{ name: 'distance', unit: 'kg' }, { name: 'elevation', unit: 'm' }], rows: [[0, 1]] };
    expect(resolve(wrongUnit).message).toBe(`data: dataset ${short}: the unit "kg" of distance is not one the engine can convert`);
    const overflow: DatasetCanonical = { ...slope, columns: [{ name: 'distance', unit: 'm' }, { name: 'elevation', unit: 'km' }], rows: [[0, 1], [1, 1e306]] };
    expect(resolve(overflow).message).toBe(`data: dataset ${short}: row 2 of elevation is not finite in SI`);
  });

  it('should be reached with a real hash of the canonical text (dataset.ts)', () => {
    const dataset = longProfile();
    const sha = hashDataset(dataset);
    expect(sha).toMatch(/^[0-9a-f]{64}$/);
    expect(resolveDataset('data', new DatasetReference(sha), 'long_profile', new Map([[sha, dataset]])).sha256).toBe(sha);
  });
});
