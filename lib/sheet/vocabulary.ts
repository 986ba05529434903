/**
 * Plain lists for completion in expression fields: units and functions people type in erosion
 * calculations. Data only (no mathjs on the client); the engine on the server decides what is valid.
 */
export const COMMON_UNITS: readonly string[] = [
  // length and area
  'm', 'km', 'cm', 'mm', 'um', 'nm', 'ft', 'mi', 'ha', 'acre',
  // time, with the geological years (Julian year; ka, Ma, Ga as aliases)
  's', 'minute', 'hour', 'day', 'week', 'yr', 'kyr', 'Myr', 'Gyr', 'ka', 'Ma', 'Ga',
  // mass, density, force, pressure, energy, power
  'kg', 'g', 't', 'tonne', 'N', 'kN', 'Pa', 'kPa', 'MPa', 'GPa', 'J', 'W', 'mW',
  // temperature and angle
  'K', 'degC', 'degF', 'deg', 'rad',
  // volume
  'L', 'mL',
];

export const COMMON_FUNCTIONS: readonly string[] = [
  'abs', 'sqrt', 'cbrt', 'exp', 'expm1', 'log', 'log10', 'log1p', 'pow', 'erf',
  'sin', 'cos', 'tan', 'asin', 'acos', 'atan', 'atan2', 'sinh', 'cosh', 'tanh',
  'min', 'max', 'mean', 'median', 'sum', 'round', 'floor', 'ceil', 'sign', 'hypot', 'number', 'unit', 'to',
];

/** Display units worth suggesting for an output, keyed by the SI unit the engine reports. */
export const DISPLAY_UNIT_CHOICES: Record<string, readonly string[]> = {
  'm / s': ['mm/yr', 'm/yr', 'm/kyr', 'm/Myr', 'km/Myr', 'cm/yr', 'm/s'],
  m: ['m', 'km', 'cm', 'mm'],
  'm^2': ['m^2', 'km^2', 'ha'],
  'm^2 / s': ['m^2/yr', 'm^2/kyr', 'km^2/Myr', 'm^2/s'],
  s: ['yr', 'kyr', 'Myr', 's'],
  'K / m': ['K/km', 'degC/km', 'K/m'],
  'kg / (m^2 s)': ['t/(km^2 yr)', 'kg/(m^2 yr)'],
  K: ['degC', 'K'],
  'kg / m^3': ['kg/m^3', 'g/cm^3', 't/m^3'],
  'm^-1': ['1/m', '1/km'],
  '1 / m': ['1/m', '1/km'],
};
