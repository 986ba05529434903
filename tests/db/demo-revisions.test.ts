import canonicalize from 'canonicalize';
import { afterAll, describe, expect, it } from 'vitest';
import { DEMO_SHEETS } from '@/lib/demo/sheets';
import { DEMO_DATA_SHEET } from '@/lib/demo/data-sheets';
import { DEMO_DATASETS, demoDataset } from '@/lib/demo/datasets';
import { Dataset } from '@/models';
import { DEMO_IN_REVIEW_INDEX, DEMO_TEAM_ID, demoSheetId, seedDemo } from '@/lib/db/seed';
import { getRevision } from '@/lib/db/revisions';
import { closeSequelize } from '@/lib/db/sequelize';
import { getSheetDetail } from '@/lib/db/sheet-detail';
import { ENGINE_VERSION, evaluateSheet, hashSheetDocument } from '@/lib/engine';

describe('demo revisions', () => {
  afterAll(closeSequelize);

  it('should give every demo sheet revision 1, and one a review in progress', async () => {
    await seedDemo();
    await seedDemo();
    for (const [index] of DEMO_SHEETS.entries()) {
      const detail = await getSheetDetail({ sheetId: demoSheetId(index), visibleTeamIds: [DEMO_TEAM_ID] });
      expect(detail.head?.number).toBe(1);
      const revision = await getRevision({ sheetId: demoSheetId(index), number: 1 });
      expect(revision.review.status).toBe(index === DEMO_IN_REVIEW_INDEX ? 'in_review' : 'unsigned');
    }
    const inReview = await getRevision({ sheetId: demoSheetId(DEMO_IN_REVIEW_INDEX), number: 1 });
    expect(inReview.review.reviewer?.email).toBe('reviewer@demo.test');
    expect(inReview.review.requestedBy?.email).toBe('editor@demo.test');
  });

  it('should reproduce the stored hash and results exactly when every demo revision is re-evaluated', async () => {
    expect(DEMO_SHEETS.length).toBeGreaterThanOrEqual(4);
    for (const [index] of DEMO_SHEETS.entries()) {
      const stored = await getRevision({ sheetId: demoSheetId(index), number: 1 });
      expect(hashSheetDocument(stored.document)).toBe(stored.hash);
      expect(stored.engineVersion).toBe(ENGINE_VERSION);
      // Canonical JSON (RFC 8785): JSONB keeps every value exactly but not key order.
      expect(canonicalize(evaluateSheet(stored.document))).toBe(canonicalize(stored.results));
    }
  });

  it('should agree with values computed independently of the engine for each demo sheet’s key outputs', async () => {
    // Closed forms evaluated here in plain arithmetic from the demo inputs (not by the engine), in SI units.
    // Formulas: Hanks et al. (1984) for scarps; Culling (1960) / Roering et al. (2007) for hillslopes;
    // Beaumont et al. (1992) and the Exner balance for the river; Turcotte & Schubert (2002) for the geotherm
    // and Airy isostasy; the Julian year 365.25 d.
    const year = 365.25 * 86400;
    const results = new Map<string, Record<string, { outputs: Record<string, { si: number | string; value: number | string }> }>>();
    for (const [index, demo] of DEMO_SHEETS.entries()) {
      const stored = await getRevision({ sheetId: demoSheetId(index), number: 1 });
      results.set(demo.document.title, (stored.results as { blocks: Record<string, { outputs: Record<string, { si: number | string; value: number | string }> }> }).blocks);
    }
    const out = (title: string, block: string, output: string): number => {
      const value = results.get(title)?.[block]?.outputs[output]?.si;
      if (typeof value !== 'number') throw new Error(`${title}: ${block}.${output} missing`);
      return value;
    };
    const close = (got: number, want: number, rel = 1e-9) => expect(Math.abs(got - want)).toBeLessThanOrEqual(rel * Math.abs(want));

    // Ember Ridge: 2a = 3.2 m, b = 0.04, θ = 17°, K = 1.2 m²/kyr → Kt = a²/(π(tanθ − b)²), age = Kt/K.
    const ember = 'Ember Ridge scarp: age from maximum slope';
    const tan17 = Math.tan((17 * Math.PI) / 180);
    const kt = 1.6 ** 2 / (Math.PI * (tan17 - 0.04) ** 2);
    close(out(ember, 'scarp', 'kt'), kt);
    close(out(ember, 'scarp', 'age'), kt / (1.2 / (1000 * year)));
    close(out(ember, 'profile', 'max_slope'), tan17); // forward at the computed age gives the measured slope back
    close(out(ember, 'slope_check', 'value'), (17 * Math.PI) / 180); // si of an angle is radians

    // Quillan Hill: C = (212.40 − 2·212.95 + 212.62)/10² = −0.0088 1/m; K = 0.0045 m²/yr; ρs/ρr = 1350/2650.
    const quillan = 'Quillan Hill: hillslope lowering and sediment yield';
    const C = (212.4 - 2 * 212.95 + 212.62) / 100;
    close(out(quillan, 'curvature', 'value'), C, 1e-9);
    close(out(quillan, 'lowering', 'dz_dt'), (0.0045 * C) / year, 1e-9);
    const erosion = -(1350 / 2650) * 0.0045 * C / year;
    close(out(quillan, 'crest', 'erosion_rate'), erosion, 1e-9);
    close(out(quillan, 'sediment_yield', 'mass_flux'), erosion * 2650, 1e-9);

    // Sorrel River: q_eq = K_f·q_w·S; dz/dt = −(q_eq − q_s)/(l_f (1 − φ)).
    const sorrel = 'Sorrel River: transport capacity and bed change at two sections';
    const upper = 0.02 * 45000 * 0.006;
    const bridge = 0.02 * 45000 * 0.002;
    close(out(sorrel, 'capacity_upper', 'capacity'), upper / year);
    close(out(sorrel, 'capacity_bridge', 'capacity'), bridge / year);
    close(out(sorrel, 'bed_upper', 'dz_dt'), -(upper - 4.1) / (1500 * 0.65) / year);
    close(out(sorrel, 'bed_bridge', 'dz_dt'), -(bridge - 4.1) / (1500 * 0.65) / year);
    expect(results.get(sorrel)?.bed_upper?.outputs.regime?.value).toBe('erosion');
    expect(results.get(sorrel)?.bed_bridge?.outputs.regime?.value).toBe('deposition');

    // Marrow Range: Pe = vL/κ; T(z) = T0 + (TL − T0)(1 − e^(−Pe z/L))/(1 − e^(−Pe)); Airy rebound ρc/ρm.
    const marrow = 'Marrow Range: advected geotherm and isostatic rebound';
    const pe = ((0.8e-3 / year) * 30e3) / 1e-6;
    close(out(marrow, 'peclet', 'Pe'), pe);
    close(out(marrow, 'geotherm', 'temperature_at_depth'), 281.15 + 582 * ((1 - Math.exp((-pe * 1.2) / 30)) / (1 - Math.exp(-pe))), 1e-9);
    close(out(marrow, 'settling_time', 'value'), (30e3 ** 2 / 1e-6) / (Math.PI ** 2 + pe ** 2 / 4), 1e-9);
    close(out(marrow, 'rebound', 'rock_uplift'), (2400 * 2750) / 3300);
    close(out(marrow, 'rebound', 'surface_lowering'), 2400 - (2400 * 2750) / 3300);
  });
  it('should seed the one set of demo datasets once, and reproduce the surveyed-data sheet with them', async () => {
    await seedDemo();
    const rows = await Dataset.findAll({ where: { teamId: DEMO_TEAM_ID }, order: [['sha256', 'ASC']] });
    expect(rows.map((d) => d.sha256)).toEqual(DEMO_DATASETS.map((d) => d.sha256).sort());
    for (const row of rows) {
      const demo = DEMO_DATASETS.find((d) => d.sha256 === row.sha256)!;
      // The original file is the demo CSV as written; the canonical form is its parse (CONTRACT §7.4).
      expect(Buffer.from(row.original).toString('utf8')).toBe(demo.csv);
      expect(row.canonical).toBe(demoDataset(demo.key).canonicalJson);
    }
    // The surveyed-data sheet comes after the others; its revision re-evaluates to the stored results.
    const stored = await getRevision({ sheetId: demoSheetId(DEMO_SHEETS.length), number: 1 });
    expect(stored.document).toEqual(DEMO_DATA_SHEET.document);
    const datasets = new Map(DEMO_DATASETS.map((d) => [d.sha256, demoDataset(d.key).canonical]));
    expect(canonicalize(evaluateSheet(stored.document, { datasets }))).toBe(canonicalize(stored.results));
    expect(stored.results.blocks.er2_fit!.status).toBe('ok');
    expect(stored.results.blocks.sorrel_march!.status).toBe('ok');
  });
});
