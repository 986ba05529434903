/**
 * Demo sheet `sorrel-river-reach` (invented site and data for the invented consultancy Harrow Vale Geoscience; the
 * list of demo sheets is lib/demo/sheets.ts). Its stored document hash is checked by tests/db/demo-revisions.test.ts.
 */
import type { DemoSheet, DemoSite } from './sheets';

const sorrelRiverSite: DemoSite = {
  name: 'Sorrel River reach',
  latitude: 46.205,
  longitude: -121.337,
  notes: 'Invented site: a gravel-bed reach upstream and downstream of a planned bridge.',
};

export const sorrelRiverReach: DemoSheet = {
  key: 'sorrel-river-reach',
  title: 'Sorrel River: transport capacity and bed change at two sections',
  site: sorrelRiverSite,
  document: {
    format: 'denudata-sheet@1',
    title: 'Sorrel River: transport capacity and bed change at two sections',
    site: sorrelRiverSite,
    blocks: [
      {
        id: 'sr-note-1',
        name: 'context',
        type: 'note',
        inputs: {},
        note: 'Two sections: the steep reach above the planned bridge and the flatter reach at the bridge. Fluxes are solid volumes per unit width, so the bed porosity applies.',
      },
      {
        id: 'sr-params',
        name: 'reach',
        type: 'quantities',
        inputs: {
          Kf: '0.02',
          discharge: '45000 m^2/yr',
          slope_upper: '0.006',
          slope_bridge: '0.002',
          supply: '4.1 m^2/yr',
          length_scale: '1500 m',
          porosity: '0.35',
        },
      },
      {
        id: 'sr-cap-upper',
        name: 'capacity_upper',
        type: 'transport_capacity',
        inputs: { coefficient: 'reach.Kf', discharge: 'reach.discharge', slope: 'reach.slope_upper' },
      },
      {
        id: 'sr-bed-upper',
        name: 'bed_upper',
        type: 'net_change',
        inputs: {
          capacity: 'capacity_upper.capacity',
          flux: 'reach.supply',
          length_scale: 'reach.length_scale',
          porosity: 'reach.porosity',
        },
      },
      {
        id: 'sr-cap-bridge',
        name: 'capacity_bridge',
        type: 'transport_capacity',
        inputs: { coefficient: 'reach.Kf', discharge: 'reach.discharge', slope: 'reach.slope_bridge' },
      },
      {
        id: 'sr-bed-bridge',
        name: 'bed_bridge',
        type: 'net_change',
        inputs: {
          capacity: 'capacity_bridge.capacity',
          flux: 'reach.supply',
          length_scale: 'reach.length_scale',
          porosity: 'reach.porosity',
        },
      },
      {
        id: 'sr-note-2',
        name: 'interpretation',
        type: 'note',
        inputs: {},
        note: 'The upper reach erodes and the bridge reach aggrades at the present supply. The length scale is poorly constrained: repeat with 500 m and 5 km before setting the soffit level.',
      },
    ],
  },
};
