/** Facts shared by the two fault-scarp block types (error-function degradation model). */
export const SCARP_SOURCES = [
  'Hanks, Bucknam, Lajoie & Wallace (1984) JGR 89(B7):5771–5790',
  'Nash (1980) J. Geol. 88:353–360',
  'Carslaw & Jaeger (1959) Conduction of Heat in Solids, ch. 2',
];

export const SCARP_VALIDITY = [
  'Initial form: an instantaneous vertical step of total offset 2a on a uniform far-field slope b (single event).',
  'Linear diffusion with uniform K in space and time; maximum slope well below about 0.6.',
  'Ages below about 1 kyr are unreliable: real scarps first pass through a gravity-controlled free-face and debris phase (Kogan & Bendick 2011).',
];

export const SCARP_CAUTIONS = [
  'Morphology determines only the product Kt; the age is only as good as K, which must come from a scarp of known age in similar climate and material.',
  'Check whether the offset is that of the far-field surfaces (2a) or a measured scarp height: they differ on sloping ground.',
  'Repeated or continuous faulting and a finite initial slope need other solutions (Hanks et al. 1984).',
];

export const SLOPE_LIMIT = 0.6;
export const YEARS_PER_KYR_SECONDS = 1000 * 365.25 * 86400;
