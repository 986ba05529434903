/**
 * Demo sheet `marrow-range-exhumation` (invented site and data for the invented consultancy Harrow Vale Geoscience; the
 * list of demo sheets is lib/demo/sheets.ts). Its stored document hash is checked by tests/db/demo-revisions.test.ts.
 */
import type { DemoSheet, DemoSite } from './sheets';

const marrowRangeSite: DemoSite = {
  name: 'Marrow Range exhumation',
  latitude: 43.551,
  longitude: 10.962,
  notes: 'Invented site: a range front with thermochronometer samples from a tunnel pilot bore.',
};

export const marrowRangeExhumation: DemoSheet = {
  key: 'marrow-range-exhumation',
  title: 'Marrow Range: advected geotherm and isostatic rebound',
  site: marrowRangeSite,
  document: {
    format: 'denudata-sheet@1',
    title: 'Marrow Range: advected geotherm and isostatic rebound',
    site: marrowRangeSite,
    blocks: [
      {
        id: 'mr-note-1',
        name: 'context',
        type: 'note',
        inputs: {},
        note: 'Apatite ages from the pilot bore suggest about 0.8 mm/yr of exhumation over the last few Myr. The geotherm sets the rock temperature expected at tunnel depth; the rebound sets how much of the eroded thickness was replaced by rock uplift.',
      },
      {
        id: 'mr-params',
        name: 'crust',
        type: 'quantities',
        inputs: {
          v: '0.8 mm/yr',
          L: '30 km',
          kappa: '1e-6 m^2/s',
          T0: '8 degC',
          TL: '590 degC',
          rho_c: '2750 kg/m^3',
          rho_m: '3300 kg/m^3',
          eroded: '2.4 km',
        },
      },
      {
        id: 'mr-peclet',
        name: 'peclet',
        type: 'peclet_number',
        inputs: { velocity: 'crust.v', length: 'crust.L', diffusivity: 'crust.kappa' },
      },
      {
        id: 'mr-geotherm',
        name: 'geotherm',
        type: 'advective_geotherm',
        inputs: {
          velocity: 'crust.v',
          thickness: 'crust.L',
          diffusivity: 'crust.kappa',
          surface_temperature: 'crust.T0',
          base_temperature: 'crust.TL',
          depth: '1.2 km',
        },
        note: 'Temperature at the deepest tunnel section, 1.2 km below the mean surface.',
      },
      {
        id: 'mr-settling',
        name: 'settling_time',
        type: 'formula',
        inputs: { expr: '(crust.L^2 / crust.kappa) / (pi^2 + peclet.Pe^2 / 4) to Myr' },
        note: 'e-folding time of the slowest thermal transient: exhumation must have lasted several times this for the steady geotherm to apply.',
      },
      {
        id: 'mr-rebound',
        name: 'rebound',
        type: 'isostatic_response',
        inputs: { crust_density: 'crust.rho_c', mantle_density: 'crust.rho_m', erosion: 'crust.eroded' },
      },
      {
        id: 'mr-note-2',
        name: 'interpretation',
        type: 'note',
        inputs: {},
        note: 'Airy rebound assumes the erosion is averaged over more than about 100 km; the range is narrower, so flexure will reduce the local response.',
      },
    ],
  },
};
