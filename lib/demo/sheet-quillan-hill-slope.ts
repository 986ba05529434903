/**
 * Demo sheet `quillan-hill-slope` (invented site and data for the invented consultancy Harrow Vale Geoscience; the
 * list of demo sheets is lib/demo/sheets.ts). Its stored document hash is checked by tests/db/demo-revisions.test.ts.
 */
import type { DemoSheet, DemoSite } from './sheets';

const quillanHillSite: DemoSite = {
  name: 'Quillan Hill slope',
  latitude: 44.918,
  longitude: -123.611,
  notes: 'Invented site: a soil-mantled convex ridge above a proposed access road.',
};

export const quillanHillSlope: DemoSheet = {
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
};
