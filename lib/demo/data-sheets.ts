/**
 * The demo sheet of surveyed data (invented data for the invented consultancy Harrow Vale Geoscience):
 * the Ember Ridge ER-2 profile fitted and evolved, and the Sorrel River reach marched, with the demo
 * datasets of lib/demo/datasets.ts (the one set the seed uploads). tests/engine/demo-data-sheet.test.ts
 * evaluates it.
 */
import type { SheetDocument } from '../engine';
import { demoDatasetInput } from './datasets';
import type { DemoSheet } from './sheets';

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
      inputs: { data: demoDatasetInput('ember_ridge_scarp'), diffusivity: 'params.K' },
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
        data: demoDatasetInput('ember_ridge_scarp'),
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
        data: demoDatasetInput('sorrel_river_long_profile'),
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
