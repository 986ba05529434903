// A small valid sheet document shared by the revision, review and comment suites.
/** A small valid document: a parameter table and a hillslope-lowering block that uses it. */
export function sampleDocument(overrides: { title?: string; K?: string; C?: string } = {}) {
  return {
    format: 'denudata-sheet@1',
    title: overrides.title ?? 'Upper slope lowering',
    site: { name: 'Test ridge', latitude: 52.1, longitude: -1.5 },
    blocks: [
      { id: 'b-params', name: 'params', type: 'quantities', inputs: { K: overrides.K ?? '0.004 m^2/yr', C: overrides.C ?? '-0.02 m^-1' } },
      { id: 'b-hill', name: 'hill', type: 'hillslope_diffusion', inputs: { diffusivity: 'params.K', curvature: 'params.C' } },
      { id: 'b-note', name: 'context', type: 'note', inputs: {}, note: 'Convex crest above the cutting.' },
    ],
  };
}
