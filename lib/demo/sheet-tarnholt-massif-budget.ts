/**
 * Demo sheet `tarnholt-massif-budget` (invented site and data for the invented consultancy Harrow Vale Geoscience; the
 * list of demo sheets is lib/demo/sheets.ts). Its stored document hash is checked by tests/db/demo-revisions.test.ts.
 */
import type { DemoSheet, DemoSite } from './sheets';

const tarnholtMassifSite: DemoSite = {
  name: 'Tarnholt Massif crustal budget',
  latitude: 46.812,
  longitude: 9.417,
  notes: 'Invented site: a thrust-bounded crystalline massif with a borehole heat-flow site, apatite fission-track ages and a small gauged catchment.',
};

export const tarnholtMassifBudget: DemoSheet = {
  key: 'tarnholt-massif-budget',
  title: 'Tarnholt Massif: geotherm, strength, exhumation and erosion budget',
  site: tarnholtMassifSite,
  document: {
    format: 'denudata-sheet@1',
    title: 'Tarnholt Massif: geotherm, strength, exhumation and erosion budget',
    site: tarnholtMassifSite,
    blocks: [
      {
        id: 'tm-note-1',
        name: 'context',
        type: 'note',
        inputs: {},
        note: 'Scoping sheet for the Tarnholt tunnel corridor. Borehole TH-2 gave a surface heat flow of 72 mW/m² with granite-gneiss heat production of 2.2 µW/m³. Apatite fission-track samples along the corridor average 6.5 Ma. A quartz-sand sample from the Lisk catchment gives the millennial erosion rate, set beside a hillslope estimate from ridge-crest curvature. All values are invented for the demo.',
      },
      {
        id: 'tm-crust',
        name: 'crust',
        type: 'radiogenic_geotherm',
        inputs: {
          surface_temperature: '9 degC',
          surface_heat_flow: '72 mW/m^2',
          conductivity: '2.8 W/(m K)',
          heat_production: '2.2 uW/m^3',
          production_depth: '9 km',
          depth: '25 km',
        },
        note: 'Steady conductive geotherm with exponential heat production (a scoping estimate, not a tunnel rock-temperature forecast).',
      },
      {
        id: 'tm-envelope',
        name: 'envelope',
        type: 'strength_envelope',
        inputs: {
          surface_temperature: '9 degC',
          geothermal_gradient: 'crust.surface_gradient',
          strain_rate: '1e-14/s',
          flow_prefactor: '1.1e-4',
          stress_exponent: '4',
          activation_energy: '223 kJ/mol',
          faulting: '"thrust"',
          conductivity: '2.8 W/(m K)',
          heat_production: '2.2 uW/m^3',
          production_depth: '9 km',
        },
        note: 'Wet quartzite flow law (Gleason & Tullis 1995) on the same radiogenic geotherm.',
      },
      {
        id: 'tm-aft',
        name: 'aft_rate',
        type: 'closure_exhumation',
        inputs: {
          age: '6.5 Ma',
          closure_temperature: '110 degC',
          thickness: '30 km',
          diffusivity: '1e-6 m^2/s',
          surface_temperature: '9 degC',
          base_temperature: '620 degC',
        },
      },
      {
        id: 'tm-advected',
        name: 'advected',
        type: 'advective_geotherm',
        inputs: {
          velocity: 'aft_rate.exhumation_rate',
          thickness: '30 km',
          diffusivity: '1e-6 m^2/s',
          surface_temperature: '9 degC',
          base_temperature: '620 degC',
          depth: 'aft_rate.closure_depth',
        },
        note: 'Check: the advected geotherm at the closure depth returns the closure temperature.',
      },
      {
        id: 'tm-budget',
        name: 'budget',
        type: 'orogen_flux_balance',
        inputs: {
          convergence_rate: '12 mm/yr',
          accreted_thickness: '6 km',
          erosion_rate: 'aft_rate.exhumation_rate',
          width: '85 km',
          taper: '0.18',
        },
      },
      {
        id: 'tm-foreland',
        name: 'foreland',
        type: 'plate_flexure',
        inputs: {
          line_load: '1.5e12 N/m',
          elastic_thickness: '22 km',
          infill_density: '2400 kg/m^3',
          plate: '"broken"',
        },
      },
      {
        id: 'tm-catchment',
        name: 'catchment',
        type: 'cosmogenic_denudation',
        inputs: {
          concentration: '8.5e4 atoms/g',
          production_rate: '6.1 atoms/(g yr)',
          density: '2.65 g/cm^3',
        },
        note: 'Production rate already scaled for the catchment hypsometry and shielding.',
      },
      {
        id: 'tm-hillslope',
        name: 'hillslope',
        type: 'hillslope_diffusion',
        inputs: { diffusivity: '0.004 m^2/yr', curvature: '-0.011 1/m' },
      },
      {
        id: 'tm-compare',
        name: 'rate_ratio',
        type: 'formula',
        inputs: { expr: 'catchment.denudation_rate / hillslope.lowering_rate' },
        note: 'Cosmogenic over hillslope rate: near 1 when the two methods agree.',
      },
    ],
  },
};
