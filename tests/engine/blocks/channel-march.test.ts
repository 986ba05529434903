import { describe, expect, it } from 'vitest';
import { perTest } from '../../support/per-test';
import { evaluateSheet, hashDataset, type DatasetCanonical, type SheetDocument } from '@/lib/engine';
import { caseDatasets, checkKey, comparableKeys, dataCase } from '../../support/data-cases';

// channel_march (CONTRACT "Additions" §4.3; FORMULAS §16): the explicit march of reference case
// P10 (Beaumont, Fullsack & Hamilton 1992; Kooi & Beaumont 1994) over a long-profile dataset,
// with porosity in the volume balance (Exner 1925; Paola & Voller 2005).

function profile(rows: number[][], third: 'discharge' | 'drainage_area' = 'discharge', units = ['m', 'm', 'm^2/yr']): DatasetCanonical {
  return {
    columns: [
      { name: 'distance', unit: units[0]! },
      { name: 'elevation', unit: units[1]! },
      { name: third, unit: units[2]! },
    ],
    format: 'denudata-dataset@1',
    kind: 'long_profile',
    rows,
  };
}

function march(dataset: DatasetCanonical, inputs: Record<string, string>) {
  const sha = hashDataset(dataset);
  const document: SheetDocument = {
    format: 'denudata-sheet@1',
    title: 'march',
    blocks: [{ id: 'b1', name: 'march', type: 'channel_march', inputs: { data: `dataset("${sha}")`, ...inputs } }],
  };
  return evaluateSheet(document, { datasets: new Map([[sha, dataset]]) }).blocks.march!;
}

for (const id of ['P46', 'P47']) {
  const c = dataCase(id);
  describe(`channel_march, reference case ${id} (${c.source})`, () => {
    const results = perTest(() => evaluateSheet(c.sheet!, { datasets: caseDatasets(c) }));
    it('should be ok without warnings', () => {
      const result = results().blocks.march!;
      expect(result.status, result.error).toBe('ok');
      expect(result.warnings).toEqual([]);
    });
    it(`should match each of the case's ${comparableKeys(c).length} expected values`, () => {
      // One evaluation for all of them (each key's difference is named when it fails).
      const misses = comparableKeys(c).map((key) => checkKey(results(), key, c.expected[key]!)).filter((miss) => miss !== null);
      expect(misses).toEqual([]);
    });
  });
}

describe('channel_march against P10 node by node (Beaumont et al. 1992; Kooi & Beaumont 1994)', () => {
  const p10 = dataCase('P10');
  const p46 = dataCase('P46');
  const result = perTest(() => evaluateSheet(p46.sheet!, { datasets: caseDatasets(p46) }).blocks.march!);
  const yr = 365.25 * 86400;
  it('should reproduce q_eq, q_in, dz/dt and q_out of P10 to 1e-9', () => {
    const expectList = (got: number[], want: number[], scale = 1) => {
      expect(got).toHaveLength(want.length);
      want.forEach((w, i) => expect(Math.abs(got[i]! / scale - w)).toBeLessThanOrEqual(1e-9 * Math.abs(w) + 1e-15));
    };
    expectList(result().series!.capacity!.y, p10.expected.q_eq!.value as number[]);
    expectList(result().series!.flux!.y.slice(0, 5), p10.expected.q_in!.value as number[]);
    expectList(result().series!.flux!.y.slice(1), p10.expected.q_out!.value as number[]);
    expectList(result().series!.dz_dt!.y, p10.expected.dz_dt!.value as number[], 1000); // mm/yr → m/yr
    expect(yr).toBe(31557600);
  });
});

describe('channel_march volume balance (FORMULAS §16: q_out − q_top = (1 − φ)(eroded − deposited))', () => {
  it('should hold exactly on an irregular profile with reverse slopes and porosity', () => {
    const rows: number[][] = [];
    let z = 300;
    for (let i = 0; i < 60; i++) {
      const x = i * 97 + 13 * Math.sin(i);
      z -= 0.4 + 0.6 * Math.sin(1.3 * i); // some reverse slopes
      rows.push([x, z, 5000 + 300 * i]);
    }
    const result = march(profile(rows), { coefficient: '0.03', length_scale: '600 m', incoming_flux: '3 m^2/yr', porosity: '0.35' });
    expect(result.status, result.error).toBe('ok');
    const out = result.outputs.outgoing_flux!.value as number;
    const eroded = result.outputs.eroded_volume_rate!.value as number;
    const deposited = result.outputs.deposited_volume_rate!.value as number;
    expect(Math.abs(out - 3 - 0.65 * (eroded - deposited))).toBeLessThan(1e-12 * Math.max(out, eroded));
    expect(result.outputs.net_volume_rate!.value).toBeCloseTo(deposited - eroded, 12);
    expect(result.warnings.some((w) => /^reverse slope on \d+ reach\(es\), first at distance .* m: capacity set to 0$/.test(w))).toBe(true);
  });
});

describe('channel_march inputs, units and drainage area', () => {
  it('should convert declared units (km, ft, km^2) to SI before marching', () => {
    // P47's profile with distance in km and elevation in ft gives the same march.
    const c = dataCase('P47');
    const base = [...caseDatasets(c).values()][0]!;
    const converted: DatasetCanonical = {
      ...base,
      columns: [
        { name: 'distance', unit: 'km' },
        { name: 'elevation', unit: 'ft' },
        { name: 'drainage_area', unit: 'km^2' },
      ],
      rows: base.rows.map(([x, z, a]) => [x! / 1000, z! / 0.3048, a!]),
    };
    const result = march(converted, { coefficient: '0.002', length_scale: '1.5 km', incoming_flux: '2 m^2/yr', porosity: '0.3', runoff: '0.8 m/yr', width: '6 m' });
    expect(result.status, result.error).toBe('ok');
    expect(Math.abs((result.outputs.outgoing_flux!.value as number) / 15.9904747103 - 1)).toBeLessThan(1e-9);
  });

  it('should refuse a reach not shorter than length_scale', () => {
    const result = march(profile([[0, 10, 100], [500, 9, 100], [1000, 8, 100]]), { coefficient: '0.01', length_scale: '500 m' });
    expect(result.status).toBe('error');
    expect(result.error).toContain('explicit march needs every reach shorter than length_scale');
    expect(Object.keys(result.outputs)).toEqual([]);
    expect(Object.keys(result.series ?? {})).toEqual(['measured']);
  });

  it('should refuse a drainage_area dataset without runoff and width', () => {
    const data = profile([[0, 10, 1], [100, 9, 2], [200, 8, 3]], 'drainage_area', ['m', 'm', 'km^2']);
    expect(march(data, { coefficient: '0.01', length_scale: '500 m', runoff: '1 m/yr' }).error).toContain('needs both runoff and width');
    expect(march(data, { coefficient: '0.01', length_scale: '500 m' }).error).toContain('needs both runoff and width');
  });

  it('should refuse runoff or width with a discharge dataset', () => {
    const data = profile([[0, 10, 100], [100, 9, 100], [200, 8, 100]]);
    expect(march(data, { coefficient: '0.01', length_scale: '500 m', width: '3 m' }).error).toContain('runoff and width apply only to a drainage_area dataset');
  });

  it.each([
    ['coefficient', '-0.1', 'coefficient: must be ≥ 0'],
    ['length_scale', '0 m', 'length_scale: must be > 0'],
    ['incoming_flux', '-1 m^2/yr', 'incoming_flux: must be ≥ 0'],
    ['porosity', '1', 'porosity: must be 0 ≤ φ < 1'],
    ['porosity', '-0.1', 'porosity: must be 0 ≤ φ < 1'],
  ])('should refuse %s = %s', (name, value, message) => {
    const inputs: Record<string, string> = { coefficient: '0.01', length_scale: '500 m', [name]: value };
    expect(march(profile([[0, 10, 100], [100, 9, 100], [200, 8, 100]]), inputs).error).toContain(message);
  });

  it('should refuse runoff ≤ 0 and width ≤ 0', () => {
    const data = profile([[0, 10, 1], [100, 9, 2], [200, 8, 3]], 'drainage_area', ['m', 'm', 'km^2']);
    expect(march(data, { coefficient: '0.01', length_scale: '500 m', runoff: '0 m/yr', width: '2 m' }).error).toContain('runoff: must be > 0');
    expect(march(data, { coefficient: '0.01', length_scale: '500 m', runoff: '1 m/yr', width: '-2 m' }).error).toContain('width: must be > 0');
  });

  it('should warn for long reaches and a drainage area that decreases downstream', () => {
    const data = profile([[0, 10, 3], [300, 9, 2], [400, 8, 3]], 'drainage_area', ['m', 'm', 'km^2']);
    const result = march(data, { coefficient: '0.01', length_scale: '500 m', runoff: '1 m/yr', width: '5 m' });
    expect(result.status, result.error).toBe('ok');
    expect(result.warnings.some((w) => w.includes('longer than half the length_scale'))).toBe(true);
    expect(result.warnings.some((w) => w.startsWith('drainage area decreases downstream on 1 reach(es), first at distance 0 m'))).toBe(true);
  });
});

describe('channel_march messages, warnings and series', () => {
  const base = { coefficient: '0.01', length_scale: '500 m' };

  it('should count reverse reaches but not flat ones, name the first, and not call a reach of exactly l_f/2 long', () => {
    // Reaches: 0→200 rises (reverse), 200→300 flat, 300→450 rises, 450→700 (dx = l_f/2 exactly) and 700→800 fall.
    const rows = [[0, 10, 100], [200, 10.5, 100], [300, 10.5, 100], [450, 11, 100], [700, 9, 100], [800, 8, 100]];
    const result = march(profile(rows), base);
    expect(result.status, result.error).toBe('ok');
    expect(result.warnings).toEqual(['reverse slope on 2 reach(es), first at distance 0 m: capacity set to 0']);
    expect(result.series!.capacity!.y.slice(0, 3)).toEqual([0, 0, 0]); // reverse and flat reaches carry no capacity
    expect(result.series!.capacity!.y[3]).toBeCloseTo(0.01 * 100 * (2 / 250), 15); // K_f·q_w·S on the falling reach
  });

  it('should give the number of long reaches and the largest dx/l_f', () => {
    const result = march(profile([[0, 10, 100], [300, 9, 100], [400, 8, 100], [800, 7, 100]]), base);
    expect(result.warnings).toEqual([
      '2 reach(es) longer than half the length_scale (dx/l_f up to 0.8): the first-order explicit scheme is inaccurate there; use a finer profile or a longer length_scale',
    ]);
  });

  it('should count drops in drainage area and name the first', () => {
    const data = profile([[0, 10, 3], [100, 9, 3], [200, 8, 2], [300, 7, 2], [400, 6, 1]], 'drainage_area', ['m', 'm', 'km^2']);
    const result = march(data, { ...base, runoff: '1 m/yr', width: '5 m' });
    expect(result.warnings).toEqual(['drainage area decreases downstream on 2 reach(es), first at distance 100 m: check the order and the area column']);
  });

  it('should name the reach that is not shorter than l_f', () => {
    const result = march(profile([[0, 10, 100], [100, 9, 100], [700, 8, 100]]), base);
    expect(result.error).toBe('block "march", explicit march needs every reach shorter than length_scale (reach 2 at distance 100 m is 600 m long, length_scale 500 m)');
  });

  it('should refuse width without runoff for drainage area, and runoff alone for discharge', () => {
    const area = profile([[0, 10, 1], [100, 9, 2], [200, 8, 3]], 'drainage_area', ['m', 'm', 'km^2']);
    expect(march(area, { ...base, width: '5 m' }).error).toContain('a drainage_area dataset needs both runoff and width');
    const discharge = profile([[0, 10, 100], [100, 9, 100], [200, 8, 100]]);
    expect(march(discharge, { ...base, runoff: '1 m/yr' }).error).toContain('runoff and width apply only to a drainage_area dataset');
  });

  it('should march a profile of two rows (one reach) and refuse one row', () => {
    const two = march(profile([[0, 10, 100], [100, 9, 100]]), base);
    expect(two.status, two.error).toBe('ok');
    expect(two.outputs.reaches!.value).toBe(1);
    // One reach: q_eq = K_f·q_w·S = 0.01·100·0.01 = 0.01 m²/yr; q_out = q_eq·dx/l_f = 0.002 m²/yr (P10's scheme).
    expect(two.outputs.outgoing_flux!.value as number).toBeCloseTo(0.002, 15);
    expect(march(profile([[0, 10, 100]]), base).error).toBe('block "march", a long profile needs at least 2 rows');
  });

  it('should refuse a long profile with neither discharge nor drainage area', () => {
    const dataset: DatasetCanonical = { columns: [{ name: 'distance', unit: 'm' }, { name: 'elevation', unit: 'm' }], format: 'denudata-dataset@1', kind: 'long_profile', rows: [[0, 10], [100, 9]] };
    const sha = hashDataset(dataset);
    const document: SheetDocument = { format: 'denudata-sheet@1', title: 'm', blocks: [{ id: 'b1', name: 'march', type: 'channel_march', inputs: { data: `dataset("${sha}")`, ...base } }] };
    expect(evaluateSheet(document, { datasets: new Map([[sha, dataset]]) }).blocks.march!.error).toBe('block "march", data: the long profile has neither discharge nor drainage_area');
  });

  it('should label every series with its axis and unit (dz/dt in mm/yr, fluxes in m²/yr)', () => {
    const result = march(profile([[0, 10, 100], [100, 9, 100], [200, 8, 100]]), base);
    const labels = Object.fromEntries(Object.entries(result.series!).map(([name, s]) => [name, [s.xLabel, s.xUnit, s.yLabel, s.yUnit]]));
    expect(labels).toEqual({
      capacity: ['Distance downstream', 'm', 'Capacity q_eq', 'm^2/yr'],
      flux: ['Distance downstream', 'm', 'Sediment flux q_s', 'm^2/yr'],
      dz_dt: ['Distance downstream', 'm', 'dz/dt', 'mm/yr'],
    });
    // A refused profile still shows what was measured.
    const refused = march(profile([[0, 10, 100], [600, 9, 100]]), base);
    expect(refused.status).toBe('error');
    expect(refused.series!.measured).toEqual({ x: [0, 600], y: [10, 9], xLabel: 'Distance downstream', yLabel: 'Elevation', xUnit: 'm', yUnit: 'm' });
  });
});
