/**
 * Typical ranges of block inputs, with their sources, for plausibility warnings. A non-zero value
 * more than 100 times outside its typical range is almost always a units slip (1e308 m^2/kyr,
 * 3 meant as 3°), so the block says so; the value is still used (warnings never change the
 * status). Values given by default are exempt, and so is zero. Ranges are in SI (a gradient for
 * slopes, K for temperatures) and apply to the absolute value.
 *
 * A channel slope typed as a bare number above 0.3 also warns "did you mean degrees?": 0.3 is a
 * very steep river already (about 17°), while 3 or 25 are what people type when they think in
 * degrees.
 */
const YEAR = 365.25 * 86400;
const PER_YEAR = 1 / YEAR;
const KM = 1000;

export interface TypicalRange {
  /** Smallest and largest typical |value| in SI units. */
  min: number;
  max: number;
  /** The range in words, with units as practitioners write them. */
  text: string;
  source: string;
  /**
   * The block type raises its own, narrower warning for this input (strength_envelope's strain
   * rate): the range is shown in the help, and no second warning is given.
   */
  warnedByType?: boolean;
}

const HILLSLOPE_K: TypicalRange = {
  min: 1e-4 * PER_YEAR,
  max: 5e-2 * PER_YEAR,
  text: '1e-4 to 5e-2 m^2/yr',
  source: 'compilations in Fernandes & Dietrich 1997 and Roering et al. 2007',
};
const SCARP_K: TypicalRange = {
  min: 1e-4 * PER_YEAR,
  max: 2e-2 * PER_YEAR,
  text: '0.1 to 20 m^2/kyr',
  source: 'scarp diffusivities compiled by Hanks 2000',
};
const CURVATURE: TypicalRange = { min: 1e-4, max: 0.2, text: '1e-4 to 0.2 1/m', source: 'Roering et al. 2007; common practice' };
const HILLSLOPE_GRADIENT: TypicalRange = { min: 0.01, max: 1.5, text: '0.01 to 1.5 (about 0.5° to 56°)', source: 'Roering et al. 1999' };
const ROCK_DENSITY: TypicalRange = { min: 2200, max: 3000, text: '2200 to 3000 kg/m^3', source: 'Turcotte & Schubert 2002, Appendix 2' };
const SOIL_DENSITY: TypicalRange = { min: 1000, max: 2000, text: '1000 to 2000 kg/m^3', source: 'Roering et al. 2007' };
const MANTLE_DENSITY: TypicalRange = { min: 3100, max: 3400, text: '3100 to 3400 kg/m^3', source: 'Turcotte & Schubert 2002, Appendix 2' };
const BULK_DENSITY: TypicalRange = { min: 1000, max: 3100, text: '1000 to 3100 kg/m^3', source: 'common practice (deposits to crystalline rock)' };
const SCARP_OFFSET: TypicalRange = { min: 0.1, max: 50, text: '0.1 to 50 m', source: 'Hanks et al. 1984; common practice' };
const FAR_FIELD_SLOPE: TypicalRange = { min: 0.001, max: 0.3, text: '0.001 to 0.3', source: 'Hanks et al. 1984; common practice' };
const SCARP_MAX_SLOPE: TypicalRange = { min: 0.05, max: 1.2, text: '0.05 to 1.2', source: 'Hanks et al. 1984; Roering et al. 1999' };
const SCARP_AGE: TypicalRange = { min: 100 * YEAR, max: 1e6 * YEAR, text: '0.1 to 1000 kyr', source: 'Hanks 2000; common practice' };
const PROFILE_HALF_WIDTH: TypicalRange = { min: 1, max: 1000, text: '1 to 1000 m', source: 'common practice' };
const CHANNEL_SLOPE: TypicalRange = { min: 1e-5, max: 0.3, text: '1e-5 to 0.3', source: 'Whipple & Tucker 1999; common practice' };
const TRANSPORT_COEFFICIENT: TypicalRange = { min: 1e-3, max: 1, text: '0.001 to 1', source: 'Kooi & Beaumont 1994' };
const UNIT_DISCHARGE: TypicalRange = { min: 1e2 * PER_YEAR, max: 1e7 * PER_YEAR, text: '1e2 to 1e7 m^2/yr', source: 'Kooi & Beaumont 1994; common practice' };
const SEDIMENT_FLUX: TypicalRange = { min: 1e-4 * PER_YEAR, max: 1e4 * PER_YEAR, text: '1e-4 to 1e4 m^2/yr', source: 'Kooi & Beaumont 1994; common practice' };
const LENGTH_SCALE: TypicalRange = { min: 100, max: 1000 * KM, text: '100 m to 1000 km', source: 'Kooi & Beaumont 1994; Beaumont et al. 1992' };
const POROSITY: TypicalRange = { min: 0.05, max: 0.5, text: '0.05 to 0.5', source: 'common practice (sands and gravels about 0.3 to 0.4)' };
const ROCK_VELOCITY: TypicalRange = { min: 0.01e-3 * PER_YEAR, max: 20e-3 * PER_YEAR, text: '0.01 to 20 mm/yr', source: 'Reiners & Brandon 2006; common practice' };
const LAYER_THICKNESS: TypicalRange = { min: 1 * KM, max: 200 * KM, text: '1 to 200 km', source: 'Turcotte & Schubert 2002; common practice' };
const THERMAL_DIFFUSIVITY: TypicalRange = { min: 0.5e-6, max: 2e-6, text: '0.5e-6 to 2e-6 m^2/s', source: 'Turcotte & Schubert 2002, §4-2' };
const SURFACE_TEMPERATURE: TypicalRange = { min: 240, max: 320, text: '-30 to 45 degC', source: 'common practice' };
const BASE_TEMPERATURE: TypicalRange = { min: 373, max: 1800, text: '100 to 1500 degC', source: 'Turcotte & Schubert 2002; common practice' };
const DRAINAGE_AREA: TypicalRange = { min: 1e4, max: 1e12, text: '0.01 to 1e6 km^2', source: 'Whipple & Tucker 1999; common practice' };
const AREA_EXPONENT: TypicalRange = { min: 0.2, max: 1, text: '0.2 to 1 (often 0.4 to 0.5)', source: 'Whipple & Tucker 1999; Kirby & Whipple 2012' };
const SLOPE_EXPONENT: TypicalRange = { min: 0.5, max: 4, text: '0.5 to 4 (often about 1)', source: 'Whipple & Tucker 1999; Kirby & Whipple 2012' };
const UPLIFT_RATE: TypicalRange = { min: 0.001e-3 * PER_YEAR, max: 20e-3 * PER_YEAR, text: '0.001 to 20 mm/yr', source: 'Kirby & Whipple 2012; common practice' };
const ERODED_THICKNESS: TypicalRange = { min: 1, max: 20 * KM, text: '1 m to 20 km', source: 'common practice' };
const DENUDATION_RATE: TypicalRange = { min: 0.001e-3 * PER_YEAR, max: 20e-3 * PER_YEAR, text: '0.001 to 20 mm/yr', source: 'Portenga & Bierman 2011; common practice' };

/* The types of CONTRACT §4b and the data-driven types. */
const MYR = 1e6 * YEAR;
const PROFILE_DEPTH: TypicalRange = { min: 10, max: 200 * KM, text: '10 m to 200 km', source: 'Turcotte & Schubert 2002; common practice' };
const SURFACE_HEAT_FLOW: TypicalRange = { min: 0.02, max: 0.15, text: '20 to 150 mW/m^2', source: 'Pollack et al. 1993 (global heat-flow compilation)' };
const CONDUCTIVITY: TypicalRange = { min: 1.5, max: 4.5, text: '1.5 to 4.5 W/(m K)', source: 'Turcotte & Schubert 2002, §4-6' };
const HEAT_PRODUCTION: TypicalRange = { min: 0.005e-6, max: 10e-6, text: '0.005 to 10 uW/m^3 (peridotite to granite)', source: 'Turcotte & Schubert 2002, §4-5' };
const PRODUCTION_DEPTH: TypicalRange = { min: 2 * KM, max: 20 * KM, text: '2 to 20 km (about 10 km in many provinces)', source: 'Roy et al. 1968; Lachenbruch 1970' };
const GEOTHERMAL_GRADIENT: TypicalRange = { min: 0.01, max: 0.06, text: '10 to 60 K/km', source: 'Turcotte & Schubert 2002, §4-6; common practice' };
const STRAIN_RATE: TypicalRange = { min: 1e-16, max: 1e-13, text: '1e-16 to 1e-13 1/s', source: 'Pfiffner & Ramsay 1982', warnedByType: true };
const FLOW_PREFACTOR: TypicalRange = { min: 1e-10, max: 1e6, text: '1e-10 to 1e6 MPa^-n s^-1 (the published flow-law tables)', source: 'Ranalli 1995, Table 10.3; from memory' };
const STRESS_EXPONENT: TypicalRange = { min: 1, max: 5, text: '1 to 5 (2.3 to 4.7 in the published sets)', source: 'Ranalli 1995, Table 10.3' };
const ACTIVATION_ENERGY: TypicalRange = { min: 1e5, max: 6e5, text: '100 to 600 kJ/mol', source: 'Ranalli 1995, Table 10.3' };
const FRICTIONAL_FACTOR: TypicalRange = { min: 0.3, max: 5, text: '0.3 to 5 (0.75 to 3 at μ = 0.75)', source: 'Sibson 1974' };
const FRICTION: TypicalRange = { min: 0.3, max: 1, text: '0.3 to 1 (0.6 to 0.85 for most rocks)', source: 'Byerlee 1978' };
const PORE_FLUID_FACTOR: TypicalRange = { min: 0.05, max: 0.99, text: '0 (dry) to 0.99 (0.37 hydrostatic)', source: 'Sibson 1974; common practice' };
const CONVERGENCE_RATE: TypicalRange = { min: 1e-3 * PER_YEAR, max: 150e-3 * PER_YEAR, text: '1 to 150 mm/yr', source: 'DeMets et al. 2010 (plate velocities)' };
const ACCRETED_THICKNESS: TypicalRange = { min: 0.5 * KM, max: 40 * KM, text: '0.5 to 40 km', source: 'Willett & Brandon 2002; common practice' };
const OROGEN_WIDTH: TypicalRange = { min: 10 * KM, max: 1000 * KM, text: '10 to 1000 km', source: 'Willett & Brandon 2002; common practice' };
const WEDGE_TAPER: TypicalRange = { min: 0.02, max: 0.5, text: '0.02 to 0.5 (tan α + tan β)', source: 'Davis et al. 1983' };
const STEADY_TOLERANCE: TypicalRange = { min: 0.01, max: 0.5, text: '0.01 to 0.5', source: 'common practice' };
const LINE_LOAD: TypicalRange = { min: 1e9, max: 1e14, text: '1e9 to 1e14 N/m', source: 'Turcotte & Schubert 2002, §3-16; Watts 2001' };
const ELASTIC_THICKNESS: TypicalRange = { min: 1 * KM, max: 100 * KM, text: '1 to 100 km', source: 'Watts 2001' };
const INFILL_DENSITY: TypicalRange = { min: 1000, max: 2900, text: '1000 (water) to 2900 kg/m^3; 0 for air', source: 'Turcotte & Schubert 2002, §3-16' };
const YOUNGS_MODULUS: TypicalRange = { min: 10e9, max: 200e9, text: '10 to 200 GPa', source: 'Turcotte & Schubert 2002, Appendix 2' };
const POISSON_RATIO: TypicalRange = { min: 0.1, max: 0.35, text: '0.1 to 0.35', source: 'Turcotte & Schubert 2002, Appendix 2' };
const FLEXURE_DISTANCE: TypicalRange = { min: 0.1 * KM, max: 2000 * KM, text: '0.1 to 2000 km', source: 'Watts 2001; common practice' };
// 1 atoms/g = 1000 /kg.
const NUCLIDE_CONCENTRATION: TypicalRange = { min: 1e2 * 1000, max: 1e7 * 1000, text: '1e2 to 1e7 atoms/g', source: 'Portenga & Bierman 2011 (compilation of 10Be concentrations)' };
const PRODUCTION_RATE: TypicalRange = { min: 1000 * PER_YEAR, max: 100 * 1000 * PER_YEAR, text: '1 to 100 atoms/(g yr)', source: 'Lal 1991; Balco et al. 2008' };
// 1 g/cm^2 = 10 kg/m^2.
const ATTENUATION_LENGTH: TypicalRange = { min: 1200, max: 2000, text: '120 to 200 g/cm^2', source: 'Gosse & Phillips 2001' };
const DECAY_CONSTANT: TypicalRange = { min: 1e-7 * PER_YEAR, max: 2e-4 * PER_YEAR, text: '1e-7 to 2e-4 1/yr (10Be to 14C); 0 for stable nuclides', source: 'Gosse & Phillips 2001' };
const COOLING_AGE: TypicalRange = { min: 0.1 * MYR, max: 1000 * MYR, text: '0.1 to 1000 Myr', source: 'Reiners & Brandon 2006; common practice' };
const CLOSURE_TEMPERATURE: TypicalRange = { min: 320, max: 850, text: '50 to 575 degC (apatite (U-Th)/He to hornblende Ar/Ar)', source: 'Reiners & Brandon 2006' };
const NODE_SPACING: TypicalRange = { min: 0.01, max: 100, text: '0.01 to 100 m', source: 'common practice' };
const STEP_COUNT: TypicalRange = { min: 10, max: 10000, text: '10 to 10000', source: 'common practice' };
const CRITICAL_SLOPE: TypicalRange = { min: 0.5, max: 2, text: '0.5 to 2 (about 1.25)', source: 'Roering et al. 1999' };
const RUNOFF: TypicalRange = { min: 0.01 * PER_YEAR, max: 5 * PER_YEAR, text: '0.01 to 5 m/yr', source: 'common practice (global mean about 0.3 m/yr)' };
const CHANNEL_WIDTH: TypicalRange = { min: 1, max: 1000, text: '1 to 1000 m', source: 'common practice' };

/** Typical ranges by "type.input". Inputs of free-form types (formula, quantities) have none. */
export const TYPICAL_RANGES: Record<string, TypicalRange> = {
  'hillslope_diffusion.diffusivity': HILLSLOPE_K,
  'hillslope_diffusion.curvature': CURVATURE,
  'hillslope_diffusion.slope': HILLSLOPE_GRADIENT,
  'hilltop_erosion.diffusivity': HILLSLOPE_K,
  'hilltop_erosion.hilltop_curvature': CURVATURE,
  'hilltop_erosion.rock_density': ROCK_DENSITY,
  'hilltop_erosion.soil_density': SOIL_DENSITY,
  'scarp_forward.vertical_offset': SCARP_OFFSET,
  'scarp_forward.far_field_slope': FAR_FIELD_SLOPE,
  'scarp_forward.diffusivity': SCARP_K,
  'scarp_forward.age': SCARP_AGE,
  'scarp_forward.half_width': PROFILE_HALF_WIDTH,
  'scarp_age.vertical_offset': SCARP_OFFSET,
  'scarp_age.far_field_slope': FAR_FIELD_SLOPE,
  'scarp_age.max_slope': SCARP_MAX_SLOPE,
  'scarp_age.diffusivity': SCARP_K,
  'transport_capacity.coefficient': TRANSPORT_COEFFICIENT,
  'transport_capacity.discharge': UNIT_DISCHARGE,
  'transport_capacity.slope': CHANNEL_SLOPE,
  'net_change.capacity': SEDIMENT_FLUX,
  'net_change.flux': SEDIMENT_FLUX,
  'net_change.length_scale': LENGTH_SCALE,
  'net_change.porosity': POROSITY,
  'peclet_number.velocity': ROCK_VELOCITY,
  'peclet_number.length': LAYER_THICKNESS,
  'peclet_number.diffusivity': THERMAL_DIFFUSIVITY,
  'advective_geotherm.velocity': ROCK_VELOCITY,
  'advective_geotherm.thickness': LAYER_THICKNESS,
  'advective_geotherm.diffusivity': THERMAL_DIFFUSIVITY,
  'advective_geotherm.surface_temperature': SURFACE_TEMPERATURE,
  'advective_geotherm.base_temperature': BASE_TEMPERATURE,
  'advective_geotherm.depth': LAYER_THICKNESS,
  'stream_power.drainage_area': DRAINAGE_AREA,
  'stream_power.slope': CHANNEL_SLOPE,
  'stream_power.m': AREA_EXPONENT,
  'stream_power.n': SLOPE_EXPONENT,
  'steady_state_channel.uplift_rate': UPLIFT_RATE,
  'steady_state_channel.m': AREA_EXPONENT,
  'steady_state_channel.n': SLOPE_EXPONENT,
  'steady_state_channel.drainage_area': DRAINAGE_AREA,
  'isostatic_response.crust_density': ROCK_DENSITY,
  'isostatic_response.mantle_density': MANTLE_DENSITY,
  'isostatic_response.erosion': ERODED_THICKNESS,
  'denudation_conversion.rate': DENUDATION_RATE,
  'denudation_conversion.density': BULK_DENSITY,

  'radiogenic_geotherm.surface_temperature': SURFACE_TEMPERATURE,
  'radiogenic_geotherm.surface_heat_flow': SURFACE_HEAT_FLOW,
  'radiogenic_geotherm.conductivity': CONDUCTIVITY,
  'radiogenic_geotherm.heat_production': HEAT_PRODUCTION,
  'radiogenic_geotherm.production_depth': PRODUCTION_DEPTH,
  'radiogenic_geotherm.depth': PROFILE_DEPTH,
  'radiogenic_geotherm.max_depth': PROFILE_DEPTH,
  'strength_envelope.surface_temperature': SURFACE_TEMPERATURE,
  'strength_envelope.geothermal_gradient': GEOTHERMAL_GRADIENT,
  'strength_envelope.strain_rate': STRAIN_RATE,
  'strength_envelope.flow_prefactor': FLOW_PREFACTOR,
  'strength_envelope.stress_exponent': STRESS_EXPONENT,
  'strength_envelope.activation_energy': ACTIVATION_ENERGY,
  'strength_envelope.faulting': FRICTIONAL_FACTOR,
  'strength_envelope.friction': FRICTION,
  'strength_envelope.pore_fluid_factor': PORE_FLUID_FACTOR,
  'strength_envelope.density': ROCK_DENSITY,
  'strength_envelope.max_depth': PROFILE_DEPTH,
  'strength_envelope.integration_depth': PROFILE_DEPTH,
  'strength_envelope.conductivity': CONDUCTIVITY,
  'strength_envelope.heat_production': HEAT_PRODUCTION,
  'strength_envelope.production_depth': PRODUCTION_DEPTH,
  'orogen_flux_balance.convergence_rate': CONVERGENCE_RATE,
  'orogen_flux_balance.accreted_thickness': ACCRETED_THICKNESS,
  'orogen_flux_balance.erosion_rate': DENUDATION_RATE,
  'orogen_flux_balance.width': OROGEN_WIDTH,
  'orogen_flux_balance.taper': WEDGE_TAPER,
  'orogen_flux_balance.steady_tolerance': STEADY_TOLERANCE,
  'plate_flexure.line_load': LINE_LOAD,
  'plate_flexure.elastic_thickness': ELASTIC_THICKNESS,
  'plate_flexure.infill_density': INFILL_DENSITY,
  'plate_flexure.mantle_density': MANTLE_DENSITY,
  'plate_flexure.youngs_modulus': YOUNGS_MODULUS,
  'plate_flexure.poisson_ratio': POISSON_RATIO,
  'plate_flexure.distance': FLEXURE_DISTANCE,
  'plate_flexure.max_distance': FLEXURE_DISTANCE,
  'cosmogenic_denudation.concentration': NUCLIDE_CONCENTRATION,
  'cosmogenic_denudation.production_rate': PRODUCTION_RATE,
  'cosmogenic_denudation.density': BULK_DENSITY,
  'cosmogenic_denudation.attenuation_length': ATTENUATION_LENGTH,
  'cosmogenic_denudation.decay_constant': DECAY_CONSTANT,
  'closure_exhumation.age': COOLING_AGE,
  'closure_exhumation.closure_temperature': CLOSURE_TEMPERATURE,
  'closure_exhumation.thickness': LAYER_THICKNESS,
  'closure_exhumation.diffusivity': THERMAL_DIFFUSIVITY,
  'closure_exhumation.surface_temperature': SURFACE_TEMPERATURE,
  'closure_exhumation.base_temperature': BASE_TEMPERATURE,
  'scarp_fit.diffusivity': SCARP_K,
  'profile_evolution.diffusivity': HILLSLOPE_K,
  'profile_evolution.duration': SCARP_AGE,
  'profile_evolution.vertical_offset': SCARP_OFFSET,
  'profile_evolution.far_field_slope': FAR_FIELD_SLOPE,
  'profile_evolution.initial_slope': HILLSLOPE_GRADIENT,
  'profile_evolution.critical_slope': CRITICAL_SLOPE,
  'profile_evolution.half_width': PROFILE_HALF_WIDTH,
  'profile_evolution.dx': NODE_SPACING,
  'profile_evolution.steps': STEP_COUNT,
  'channel_march.coefficient': TRANSPORT_COEFFICIENT,
  'channel_march.length_scale': LENGTH_SCALE,
  'channel_march.incoming_flux': SEDIMENT_FLUX,
  'channel_march.porosity': POROSITY,
  'channel_march.runoff': RUNOFF,
  'channel_march.width': CHANNEL_WIDTH,
};

/**
 * Inputs whose dimension cannot carry a typical range because it depends on another input (the
 * erodibility K's unit depends on m). Listed so that a test can check every other input has one.
 */
export const NO_TYPICAL_RANGE = new Set([
  'stream_power.coefficient',
  'steady_state_channel.coefficient',
  // A position on the profile, not a magnitude: any value (0 included) is plausible.
  'scarp_fit.x0',
]);

/** Channel-slope inputs where a bare number above this is probably meant in degrees. */
export const CHANNEL_SLOPE_INPUTS = new Set(['transport_capacity.slope', 'stream_power.slope']);
export const BARE_SLOPE_LIMIT = 0.3;
/** Any other slope input: a bare gradient above 2 (63°) is steeper than any soil-mantled or scarp face. */
export const BARE_HILLSLOPE_LIMIT = 2;

/** The factor beyond a typical range at which a value is called implausible. */
export const PLAUSIBILITY_FACTOR = 100;

export function typicalRange(typeId: string, input: string): TypicalRange | undefined {
  return TYPICAL_RANGES[`${typeId}.${input}`];
}

/** Whether a non-zero SI value is more than PLAUSIBILITY_FACTOR times outside the range. */
export function isImplausible(range: TypicalRange, si: number): boolean {
  if (si === 0) return false;
  const magnitude = Math.abs(si);
  return magnitude > range.max * PLAUSIBILITY_FACTOR || magnitude < range.min / PLAUSIBILITY_FACTOR;
}
