/**
 * Demo sheet `ember-ridge-scarp` (invented site and data for the invented consultancy Harrow Vale Geoscience; the
 * list of demo sheets is lib/demo/sheets.ts). Its stored document hash is checked by tests/db/demo-revisions.test.ts.
 */
import type { DemoSheet, DemoSite } from './sheets';

const emberRidgeSite: DemoSite = {
  name: 'Ember Ridge fault scarp',
  latitude: 41.372,
  longitude: -117.804,
  notes: 'Invented site: a single-event normal fault scarp across an alluvial fan surface.',
};

export const emberRidgeScarp: DemoSheet = {
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
};
