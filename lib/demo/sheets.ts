/**
 * Demo sheets: worked calculations for an invented consultancy, Harrow Vale Geoscience, at four
 * fictional sites. The values are plausible (within the published ranges the block types cite)
 * but invented; they describe no real place.
 */
import type { SheetDocument } from '../engine';

export interface DemoSite {
  name: string;
  latitude?: number;
  longitude?: number;
  notes?: string;
}

export interface DemoSheet {
  key: string;
  title: string;
  site: DemoSite;
  document: SheetDocument;
}

const emberRidgeSite: DemoSite = {
  name: 'Ember Ridge fault scarp',
  latitude: 41.372,
  longitude: -117.804,
  notes: 'Invented site: a single-event normal fault scarp across an alluvial fan surface.',
};

const quillanHillSite: DemoSite = {
  name: 'Quillan Hill slope',
  latitude: 44.918,
  longitude: -123.611,
  notes: 'Invented site: a soil-mantled convex ridge above a proposed access road.',
};

const sorrelRiverSite: DemoSite = {
  name: 'Sorrel River reach',
  latitude: 46.205,
  longitude: -121.337,
  notes: 'Invented site: a gravel-bed reach upstream and downstream of a planned bridge.',
};

const marrowRangeSite: DemoSite = {
  name: 'Marrow Range exhumation',
  latitude: 43.551,
  longitude: 10.962,
  notes: 'Invented site: a range front with thermochronometer samples from a tunnel pilot bore.',
};

const tarnholtMassifSite: DemoSite = {
  name: 'Tarnholt Massif crustal budget',
  latitude: 46.812,
  longitude: 9.417,
  notes: 'Invented site: a thrust-bounded crystalline massif with a borehole heat-flow site, apatite fission-track ages and a small gauged catchment.',
};

export const DEMO_SHEETS: DemoSheet[] = [
  {
    key: 'ember-ridge-scarp',
    title: 'Ember Ridge scarp: age from maximum slope',
    site: emberRidgeSite,
    document: {
      format: 'denudata-sheet@1',
      title: 'Ember Ridge scarp: age from maximum slope',
      site: emberRidgeSite,
      blocks: [
        {
          id: 'er-note-1',
          name: 'context',
          type: 'note',
          inputs: {},
          note: 'Profile ER-3 was surveyed across the scarp with a total station (0.5 m spacing). The far-field fan surface dips 0.04 toward the upthrown side on both sides of the scarp. The steepest 2 m of the face measured 17°. Diffusivity is taken from a dated shoreline scarp in similar arid fan gravels.',
        },
        {
          id: 'er-params',
          name: 'survey',
          type: 'quantities',
          inputs: {
            offset: '3.2 m',
            far_field: '0.04',
            steepest: '17 deg',
            K: '1.2 m^2/kyr',
          },
          note: 'Offset of the far-field surfaces (2a), not the face height.',
        },
        {
          id: 'er-age',
          name: 'scarp',
          type: 'scarp_age',
          inputs: {
            vertical_offset: 'survey.offset',
            far_field_slope: 'survey.far_field',
            max_slope: 'survey.steepest',
            diffusivity: 'survey.K',
          },
        },
        {
          id: 'er-profile',
          name: 'profile',
          type: 'scarp_forward',
          inputs: {
            vertical_offset: 'survey.offset',
            far_field_slope: 'survey.far_field',
            diffusivity: 'survey.K',
            age: 'scarp.age',
            half_width: '20 m',
          },
          note: 'Forward model at the computed age, to compare with the surveyed profile.',
        },
        {
          id: 'er-check',
          name: 'slope_check',
          type: 'formula',
          inputs: { expr: 'atan(profile.max_slope) * (1 rad) to deg' },
          note: 'Should return the measured 17°.',
        },
        {
          id: 'er-note-2',
          name: 'interpretation',
          type: 'note',
          inputs: {},
          note: 'The age rests on the borrowed diffusivity: a factor-of-two uncertainty in K gives a factor-of-two uncertainty in age. Treat the result as an estimate for trenching design, not a date.',
        },
      ],
    },
  },
  {
    key: 'quillan-hill-slope',
    title: 'Quillan Hill: hillslope lowering and sediment yield',
    site: quillanHillSite,
    document: {
      format: 'denudata-sheet@1',
      title: 'Quillan Hill: hillslope lowering and sediment yield',
      site: quillanHillSite,
      blocks: [
        {
          id: 'qh-note-1',
          name: 'context',
          type: 'note',
          inputs: {},
          note: 'Three LiDAR points 10 m apart across the ridge crest (1 m DEM, 5 m smoothing). Soil and rock densities from two pits on the ridge.',
        },
        {
          id: 'qh-params',
          name: 'ridge',
          type: 'quantities',
          inputs: {
            K: '0.0045 m^2/yr',
            z_west: '212.40 m',
            z_crest: '212.95 m',
            z_east: '212.62 m',
            spacing: '10 m',
            rho_soil: '1350 kg/m^3',
            rho_rock: '2650 kg/m^3',
          },
        },
        {
          id: 'qh-curvature',
          name: 'curvature',
          type: 'formula',
          inputs: { expr: '(ridge.z_west - 2 * ridge.z_crest + ridge.z_east) / ridge.spacing^2' },
          display: { value: 'm^-1' },
          note: 'Three-point curvature d²z/dx²; negative on the convex crest.',
        },
        {
          id: 'qh-lowering',
          name: 'lowering',
          type: 'hillslope_diffusion',
          inputs: { diffusivity: 'ridge.K', curvature: 'curvature.value', slope: '0.18' },
        },
        {
          id: 'qh-hilltop',
          name: 'crest',
          type: 'hilltop_erosion',
          inputs: {
            diffusivity: 'ridge.K',
            hilltop_curvature: 'curvature.value',
            rock_density: 'ridge.rho_rock',
            soil_density: 'ridge.rho_soil',
          },
          note: 'K describes a soil-volume flux here, so the density ratio applies.',
        },
        {
          id: 'qh-yield',
          name: 'sediment_yield',
          type: 'denudation_conversion',
          inputs: { rate: 'crest.erosion_rate', density: 'ridge.rho_rock' },
        },
        {
          id: 'qh-note-2',
          name: 'interpretation',
          type: 'note',
          inputs: {},
          note: 'Steady state is assumed for the ridge; check it against the incision history of the valley below before using the yield for the road drainage design.',
        },
      ],
    },
  },
  {
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
  },
  {
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
  },
  {
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
  },
];

/** The same list under a camel-case name. */
export const demoSheets = DEMO_SHEETS;
