/**
 * Demo datasets for the invented scenario of Harrow Vale Geoscience: a surveyed scarp profile at the
 * fictional Ember Ridge site and a river long profile of the fictional Sorrel River. The numbers are made
 * up (an erf-shaped scarp with a few centimetres of scatter; a concave long profile with a small sill);
 * they describe no real place. Seeded into the demo team by lib/db/seed.ts.
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
}

export const DEMO_DATASETS: DemoDataset[] = [
  {
    key: 'ember_ridge_scarp',
    name: 'Ember Ridge scarp, line ER-2 (total station)',
    description:
      'Invented demo survey: profile ER-2 across the Ember Ridge fault scarp, perpendicular to the trace, distance positive toward the upthrown side. Total station, 1.5 cm; the points marked 4 cm were shot by GNSS. Local datum.',
    kind: 'slope_profile',
    filename: 'ember-ridge-er2.csv',
    csv: `distance [m],elevation [m],elevation_sd [m]
-24,1516.941,0.015
-22,1517.050,0.015
-20,1517.182,0.015
-18,1517.286,0.015
-16,1517.422,0.015
-14,1517.553,0.04
-12,1517.704,0.015
-10,1517.878,0.015
-8,1518.109,0.015
-7,1518.258,0.015
-6,1518.438,0.015
-5,1518.593,0.04
-4,1518.829,0.015
-3,1519.077,0.015
-2,1519.339,0.015
-1,1519.618,0.015
0,1519.895,0.015
1,1520.168,0.04
2,1520.453,0.015
3,1520.727,0.015
4,1520.969,0.015
5,1521.216,0.015
6,1521.427,0.015
7,1521.645,0.04
8,1521.764,0.015
9,1521.909,0.015
10,1522.039,0.015
12,1522.239,0.015
14,1522.380,0.015
16,1522.488,0.04
18,1522.661,0.015
20,1522.761,0.015
22,1522.899,0.015
24,1523.008,0.015
`,
  },
  {
    key: 'sorrel_river_long_profile',
    name: 'Sorrel River long profile, bridge reach',
    description:
      'Invented demo data: thalweg of the Sorrel River from the upper gauge to the confluence, read off a 2 m elevation model every 500 m, with drainage area from the same model. A small bedrock sill lies between 4 and 5.5 km.',
    kind: 'long_profile',
    filename: 'sorrel-river-long-profile.csv',
    csv: `distance [m],elevation [m],drainage_area [km^2]
0,320.00,14.00
500,302.87,14.77
1000,287.37,15.77
1500,273.35,16.87
2000,260.66,18.06
2500,249.18,19.31
3000,238.79,20.60
3500,229.39,21.94
4000,220.88,23.32
4500,214.68,24.74
5000,207.72,26.19
5500,201.42,27.66
6000,194.21,29.17
6500,189.06,30.70
7000,184.39,32.25
7500,180.16,33.83
8000,176.34,35.42
8500,172.88,37.04
9000,169.75,38.67
9500,166.92,40.33
10000,164.36,42.00
`,
  },
];

/** The canonical form and sha256 of a demo dataset (for demo sheets that refer to it). */
export function demoDataset(key: DemoDataset['key']) {
  const entry = DEMO_DATASETS.find((d) => d.key === key)!;
  const parsed = parseDatasetText(entry.csv, entry.kind);
  if (!parsed.ok) throw new Error(`demo dataset ${key} is invalid: ${parsed.message}`);
  return { ...entry, sha256: parsed.sha256, canonical: parsed.dataset, canonicalJson: parsed.canonicalJson, rowCount: parsed.rowCount };
}

/** `dataset("<sha256>")` for a demo dataset, for the data input of a demo sheet. */
export const demoDatasetInput = (key: DemoDataset['key']) => `dataset("${demoDataset(key).sha256}")`;
