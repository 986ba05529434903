import { STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';
import { EngineError } from '../errors';

/** Steady-state denudation rate from an in-situ cosmogenic nuclide concentration (Lal 1991). */
export const cosmogenicDenudation: BlockTypeDefinition = {
  id: 'cosmogenic_denudation',
  title: 'Cosmogenic-nuclide denudation rate',
  purpose: 'Steady denudation rate of a surface or catchment from an in-situ nuclide concentration, with its averaging time.',
  formula: {
    text: 'N = P/(λ + ρ·ε/Λ), so ε = (P/N − λ)·Λ/ρ;  averaging time = 1/(P/N − λ);  absorption depth = Λ/ρ;  saturation = P/λ',
    tex: '\\varepsilon = \\left(\\frac{P}{N} - \\lambda\\right)\\frac{\\Lambda}{\\rho}',
  },
  sources: [
    'Lal (1991) EPSL 104:424–439',
    'Chmeleff et al. (2010) NIMB 268:192–199',
    'Korschinek et al. (2010) NIMB 268:187–191',
    'von Blanckenburg (2005) EPSL 237:462–479',
    'Granger, Kirchner & Finkel (1996) J. Geol. 104:249–257',
    'Balco, Stone, Lifton & Dunai (2008) Quat. Geochronol. 3:174–195',
  ],
  inputs: [
    {
      name: 'concentration',
      label: 'Concentration N',
      symbol: 'N',
      dimension: 'per_mass',
      unitHint: 'atoms/g',
      range: { min: 0, minExclusive: true, text: '> 0' },
      mismatchHint: 'Write atoms/g (for example 2.4e5 atoms/g), never at/g: mathjs reads "at" as the attotonne, so at/g gives a plain number',
      help: 'Nuclide concentration in atoms/g (dimension 1/M; `atoms` is a dimensionless unit, so 2.4e5 atoms/g = 2.4e5 / g). Write atoms/g, never at/g (read as attotonnes per gram).',
    },
    {
      name: 'production_rate',
      label: 'Surface production rate P',
      symbol: 'P',
      dimension: 'per_mass_time',
      unitHint: 'atoms/(g yr)',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Site-specific surface spallation production rate in atoms/(g yr), already scaled for latitude and altitude and corrected for topographic, snow and vegetation shielding (about 4 atoms/(g yr) for 10Be at sea level, high latitude). For river sand, the production rate averaged over the quartz-contributing area. The block does no scaling.',
    },
    {
      name: 'density',
      label: 'Rock density ρ',
      symbol: 'ρ',
      dimension: 'density',
      unitHint: 'g/cm^3',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Density of the eroding material (2.65–2.7 g/cm^3 for rock).',
    },
    {
      name: 'attenuation_length',
      label: 'Attenuation length Λ',
      symbol: 'Λ',
      dimension: 'mass_per_area',
      default: '160 g/cm^2',
      unitHint: 'g/cm^2',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Attenuation length of spallation, a mass per area (150–170 g/cm^2; default 160 g/cm^2).',
    },
    {
      name: 'decay_constant',
      label: 'Decay constant λ',
      symbol: 'λ',
      dimension: 'rate',
      default: 'log(2) / (1.387 Myr)',
      unitHint: 'Myr^-1',
      range: { min: 0, text: '≥ 0' },
      help: 'Decay constant of the nuclide (default 10Be: ln 2/(1.387 Myr), written log(2) / (1.387 Myr)). 26Al: log(2)/(0.705 Myr); 36Cl: about log(2)/(0.301 Myr); 0 for stable 3He and 21Ne.',
    },
  ],
  outputs: [
    { name: 'denudation_rate', label: 'Denudation rate ε', unit: 'mm/kyr', kind: 'quantity', description: '(P/N − λ)·Λ/ρ.' },
    { name: 'averaging_time', label: 'Averaging time', unit: 'kyr', kind: 'quantity', description: '1/(P/N − λ), the time to remove one absorption depth.' },
    { name: 'absorption_depth', label: 'Absorption depth z*', unit: 'cm', kind: 'quantity', description: 'Λ/ρ (about 60 cm in rock).' },
    { name: 'saturation_concentration', label: 'Saturation concentration', unit: 'atoms/g', kind: 'quantity', description: 'P/λ, the concentration of a surface that does not erode; only when λ > 0.' },
  ],
  validity: [
    'Steady erosion over the averaging time, spallation production only (muons ignored), no inheritance, burial or storage.',
    'P is the site\u2019s (or catchment\u2019s) scaled and shielding-corrected surface production rate.',
  ],
  cautions: [
    'Spallation only: muons supply a larger share of N at steady erosion, so the rate is biased low, by roughly 8 % at 1 mm/kyr to 20 % above 0.05 mm/yr (check with a full production model).',
    'Recent changes in erosion rate, deep landsliding in small catchments, sediment storage, inheritance and quartz enrichment by weathering all bias the rate.',
    'Report analytical (about 2–5 %) and production-rate (about 5–10 %) uncertainties, and never extrapolate a rate beyond its averaging time.',
    STANDING_CAUTION,
  ],
  warnings: ['Concentration above half of saturation (N > P/(2λ)): the error amplification |d ln ε/d ln N| exceeds 2.'],
  example: {
    inputs: { concentration: '1e5 atoms/g', production_rate: '5 atoms/(g yr)', density: '2.7 g/cm^3' },
    output: 'denudation_rate',
    expected: { value: 29.3334840746, unit: 'mm / kyr', relTol: 1e-9 },
    source: 'reference case P32 (Lal 1991; Chmeleff et al. 2010; Korschinek et al. 2010)',
  },
  expressionFunction: true,
  evaluate(inputs) {
    const n = required(inputs, 'concentration');
    const p = required(inputs, 'production_rate');
    const density = required(inputs, 'density');
    const attenuation = required(inputs, 'attenuation_length');
    const decay = required(inputs, 'decay_constant');
    const excess = p / n - decay;
    if (!(excess > 0)) {
      throw new EngineError(
        `concentration: at or above saturation (P/N = ${(p / n).toPrecision(4)} /s ≤ λ = ${decay.toPrecision(4)} /s, N ≥ P/λ = ${(p / decay).toPrecision(4)} per kg): no steady denudation rate fits`,
        { input: 'concentration' },
      );
    }
    const rate = (excess * attenuation) / density;
    const outputs: Record<string, { si: number }> = {
      denudation_rate: { si: rate },
      averaging_time: { si: 1 / excess },
      absorption_depth: { si: attenuation / density },
    };
    const warnings: string[] = [];
    if (decay > 0) {
      outputs.saturation_concentration = { si: p / decay };
      if (n > p / (2 * decay)) {
        const amplification = p / n / excess;
        warnings.push(`Measured concentration above half of saturation (N/N_sat = ${((n * decay) / p).toFixed(3)}): the error amplification |d ln ε/d ln N| is ${amplification.toFixed(2)}, so small errors in N give large errors in the rate.`);
      }
    }
    return { outputs, warnings };
  },
};
