/**
 * The demo datasets, one set for the whole invented scenario of Harrow Vale Geoscience: a total-station
 * profile across the fictional Ember Ridge fault scarp and a long profile of the fictional Sorrel River
 * bridge reach. The numbers were generated from the models with a fixed, deterministic perturbation; they
 * describe no real place. lib/db/seed.ts uploads them to the demo team once (the CSV below is each
 * dataset's original file) and the surveyed-data sheet (lib/demo/data-sheets.ts) refers to them by hash.
 */
import type { DatasetKind } from '../engine/dataset';
import { parseDatasetText } from '../datasets/parse';

export interface DemoDataset {
  key: 'ember_ridge_scarp' | 'sorrel_river_long_profile';
  name: string;
  description: string;
  kind: DatasetKind;
  filename: string;
  csv: string;
  /** The SHA-256 of the canonical form, pinned so seeded databases and demo revisions keep their hashes. */
  sha256: string;
}

export const DEMO_DATASETS: DemoDataset[] = [
  {
    key: 'ember_ridge_scarp',
    name: 'Ember Ridge scarp, total-station profile ER-2',
    description:
      'Invented demo survey: 49 points across the Ember Ridge fault scarp, perpendicular to the trace, distance increasing toward the upthrown side. 2 cm sd, 3 cm on every sixth point (prism pole on loose debris). Local datum.',
    kind: 'slope_profile',
    filename: 'ember-ridge-er2.csv',
    sha256: '92c06e63389ab4f37a9e8f4d5aa6b7edcc6f7234ceb9d5f4d9b0ee2817ffeb90',
    csv: `distance [m],elevation [m],elevation_sd [m]
-24.00,509.477,0.020
-22.76,509.535,0.020
-21.87,509.574,0.020
-21.17,509.617,0.030
-20.22,509.690,0.020
-18.95,509.781,0.020
-17.75,509.854,0.020
-16.92,509.890,0.020
-16.21,509.918,0.020
-15.19,509.981,0.030
-13.89,510.080,0.020
-12.75,510.175,0.020
-11.97,510.235,0.020
-11.23,510.280,0.020
-10.15,510.356,0.020
-8.85,510.482,0.030
-7.77,510.620,0.020
-7.03,510.734,0.020
-6.25,510.853,0.020
-5.10,511.032,0.020
-3.81,511.263,0.020
-2.79,511.479,0.030
-2.08,511.657,0.020
-1.25,511.878,0.020
-0.05,512.194,0.020
1.22,512.518,0.020
2.17,512.749,0.020
2.87,512.920,0.030
3.76,513.148,0.020
5.00,513.448,0.020
6.24,513.707,0.020
7.13,513.857,0.020
7.83,513.953,0.020
8.78,514.081,0.030
10.05,514.247,0.020
11.25,514.391,0.020
12.08,514.478,0.020
12.79,514.531,0.020
13.81,514.593,0.020
15.11,514.674,0.030
16.25,514.756,0.020
17.03,514.823,0.020
17.77,514.882,0.020
18.85,514.943,0.020
20.15,515.006,0.020
21.23,515.058,0.030
21.97,515.107,0.020
22.75,515.170,0.020
23.90,515.253,0.020
`,
  },
  {
    key: 'sorrel_river_long_profile',
    name: 'Sorrel River long profile, bridge reach',
    description:
      'Invented demo data: thalweg of the Sorrel River reach upstream of the planned bridge, 25 nodes every 200 m downstream from a made-up 5 m elevation model, with drainage area from the same model.',
    kind: 'long_profile',
    filename: 'sorrel-river-long-profile.csv',
    sha256: '79717837106335931caf3e88ae42c682af0c526c84b3e2019248c8fd7ae2b0b4',
    csv: `distance [m],elevation [m],drainage_area [km^2]
0,318.00,38.00
200,315.60,38.35
400,313.40,38.70
600,311.10,39.05
800,309.10,39.40
1000,307.30,39.75
1200,305.60,40.10
1400,304.00,40.45
1600,302.80,40.80
1800,302.00,41.15
2000,301.50,41.50
2200,301.10,41.85
2400,300.66,42.20
2600,300.06,42.55
2800,299.06,42.90
3000,297.76,43.25
3200,296.36,43.60
3400,295.16,43.95
3600,294.36,44.30
3800,293.80,44.65
4000,293.44,45.00
4200,293.20,45.35
4400,293.00,45.70
4600,292.70,46.05
4800,292.30,46.40
`,
  },
];

/** The canonical form of a demo dataset, parsed from its CSV (and checked against the pinned hash). */
export function demoDataset(key: DemoDataset['key']) {
  const entry = DEMO_DATASETS.find((d) => d.key === key)!;
  const parsed = parseDatasetText(entry.csv, entry.kind);
  if (!parsed.ok) throw new Error(`demo dataset ${key} is invalid: ${parsed.message}`);
  if (parsed.sha256 !== entry.sha256) throw new Error(`demo dataset ${key} hashes to ${parsed.sha256}, not ${entry.sha256}`);
  return { ...entry, canonical: parsed.dataset, canonicalJson: parsed.canonicalJson, rowCount: parsed.rowCount };
}

/** `dataset("<sha256>")` for a demo dataset, for the data input of a demo sheet. */
export const demoDatasetInput = (key: DemoDataset['key']) => `dataset("${DEMO_DATASETS.find((d) => d.key === key)!.sha256}")`;
