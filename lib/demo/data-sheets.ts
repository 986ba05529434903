/**
 * Demo datasets and the demo sheet that uses them (invented data for the invented consultancy
 * Harrow Vale Geoscience): a total-station profile across the Ember Ridge scarp and a long
 * profile of the Sorrel River reach from a made-up DEM. The numbers were generated from the
 * model with a fixed, deterministic perturbation; they describe no real place. The seed adds the
 * datasets to the demo team (lib/datasets, with the upload table) and this sheet beside the
 * others; tests/engine/demo-data-sheet.test.ts evaluates it.
 */
import type { DatasetCanonical, SheetDocument } from '../engine';
import type { DemoSheet } from './sheets';

export interface DemoDataset {
  sha256: string;
  name: string;
  description: string;
  canonical: DatasetCanonical;
}

export const EMBER_RIDGE_PROFILE: DemoDataset = {
  sha256: '92c06e63389ab4f37a9e8f4d5aa6b7edcc6f7234ceb9d5f4d9b0ee2817ffeb90',
  name: 'Ember Ridge scarp, total-station profile ER-2',
  description: 'Invented demo data: 49 points across the scarp, x increasing toward the upthrown side; 2 cm sd, 3 cm on every sixth point (prism pole on loose debris).',
  canonical: {
    columns: [
      { name: 'distance', unit: 'm' },
      { name: 'elevation', unit: 'm' },
      { name: 'elevation_sd', unit: 'm' },
    ],
    format: 'denudata-dataset@1',
    kind: 'slope_profile',
    rows: [[-24,509.477,0.02],[-22.76,509.535,0.02],[-21.87,509.574,0.02],[-21.17,509.617,0.03],[-20.22,509.69,0.02],[-18.95,509.781,0.02],[-17.75,509.854,0.02],[-16.92,509.89,0.02],[-16.21,509.918,0.02],[-15.19,509.981,0.03],[-13.89,510.08,0.02],[-12.75,510.175,0.02],[-11.97,510.235,0.02],[-11.23,510.28,0.02],[-10.15,510.356,0.02],[-8.85,510.482,0.03],[-7.77,510.62,0.02],[-7.03,510.734,0.02],[-6.25,510.853,0.02],[-5.1,511.032,0.02],[-3.81,511.263,0.02],[-2.79,511.479,0.03],[-2.08,511.657,0.02],[-1.25,511.878,0.02],[-0.05,512.194,0.02],[1.22,512.518,0.02],[2.17,512.749,0.02],[2.87,512.92,0.03],[3.76,513.148,0.02],[5,513.448,0.02],[6.24,513.707,0.02],[7.13,513.857,0.02],[7.83,513.953,0.02],[8.78,514.081,0.03],[10.05,514.247,0.02],[11.25,514.391,0.02],[12.08,514.478,0.02],[12.79,514.531,0.02],[13.81,514.593,0.02],[15.11,514.674,0.03],[16.25,514.756,0.02],[17.03,514.823,0.02],[17.77,514.882,0.02],[18.85,514.943,0.02],[20.15,515.006,0.02],[21.23,515.058,0.03],[21.97,515.107,0.02],[22.75,515.17,0.02],[23.9,515.253,0.02]],
  },
};

export const SORREL_RIVER_LONG_PROFILE: DemoDataset = {
  sha256: '79717837106335931caf3e88ae42c682af0c526c84b3e2019248c8fd7ae2b0b4',
  name: 'Sorrel River long profile, bridge reach',
  description: 'Invented demo data: 25 nodes every 200 m downstream from a made-up 5 m DEM, drainage area from the same DEM.',
  canonical: {
    columns: [
      { name: 'distance', unit: 'm' },
      { name: 'elevation', unit: 'm' },
      { name: 'drainage_area', unit: 'km^2' },
    ],
    format: 'denudata-dataset@1',
    kind: 'long_profile',
    rows: [[0,318,38],[200,315.6,38.35],[400,313.4,38.7],[600,311.1,39.05],[800,309.1,39.4],[1000,307.3,39.75],[1200,305.6,40.1],[1400,304,40.45],[1600,302.8,40.8],[1800,302,41.15],[2000,301.5,41.5],[2200,301.1,41.85],[2400,300.66,42.2],[2600,300.06,42.55],[2800,299.06,42.9],[3000,297.76,43.25],[3200,296.36,43.6],[3400,295.16,43.95],[3600,294.36,44.3],[3800,293.8,44.65],[4000,293.44,45],[4200,293.2,45.35],[4400,293,45.7],[4600,292.7,46.05],[4800,292.3,46.4]],
  },
};

export const DEMO_DATASETS: DemoDataset[] = [EMBER_RIDGE_PROFILE, SORREL_RIVER_LONG_PROFILE];

const document: SheetDocument = {
  format: 'denudata-sheet@1',
  title: 'Ember Ridge and Sorrel River: surveyed profiles fitted, evolved and marched',
  site: {
    name: 'Ember Ridge fault scarp',
    latitude: 41.372,
    longitude: -117.804,
    notes: 'Invented site: the ER-2 total-station profile across the scarp, and the Sorrel River bridge reach downstream.',
  },
  blocks: [
    {
      id: 'dd-note-1',
      name: 'survey_note',
      type: 'note',
      inputs: {},
      note: 'Profile ER-2 was surveyed across the Ember Ridge scarp by Harrow Vale Geoscience (invented demo data). The fit gives Kt with its 95 % interval; the age uses the regional diffusivity calibrated on a dated shoreline riser (demo value). The forward run shows the scarp 10 kyr from now under nonlinear transport.',
    },
    {
      id: 'dd-k',
      name: 'params',
      type: 'quantities',
      inputs: { K: '1.1 m^2/kyr', Sc: '1.25' },
    },
    {
      id: 'dd-fit',
      name: 'er2_fit',
      type: 'scarp_fit',
      inputs: { data: 'dataset("92c06e63389ab4f37a9e8f4d5aa6b7edcc6f7234ceb9d5f4d9b0ee2817ffeb90")', diffusivity: 'params.K' },
    },
    {
      id: 'dd-evo',
      name: 'er2_future',
      type: 'profile_evolution',
      inputs: {
        diffusivity: 'params.K',
        duration: '10 kyr',
        critical_slope: 'params.Sc',
        boundary: '"zero_flux"',
        dx: '0.5 m',
        data: 'dataset("92c06e63389ab4f37a9e8f4d5aa6b7edcc6f7234ceb9d5f4d9b0ee2817ffeb90")',
      },
    },
    {
      id: 'dd-note-2',
      name: 'river_note',
      type: 'note',
      inputs: {},
      note: 'The Sorrel River reach upstream of the planned bridge: the explicit downstream march gives capacity, sediment flux and bed change reach by reach (demo runoff, width and length scale).',
    },
    {
      id: 'dd-march',
      name: 'sorrel_march',
      type: 'channel_march',
      inputs: {
        data: 'dataset("79717837106335931caf3e88ae42c682af0c526c84b3e2019248c8fd7ae2b0b4")',
        coefficient: '0.02',
        length_scale: '1.5 km',
        incoming_flux: '4 m^2/yr',
        porosity: '0.35',
        runoff: '0.45 m/yr',
        width: '18 m',
      },
    },
  ],
};

export const DEMO_DATA_SHEET: DemoSheet = {
  key: 'ember-ridge-sorrel-data',
  title: document.title,
  site: document.site!,
  document,
};
