/**
 * The explicit downstream march of under-capacity transport along a surveyed long profile
 * (CONTRACT "Additions" §4.3; FORMULAS §16 and case P10).
 */
import { BlockFailure, STANDING_CAUTION, required, type BlockTypeDefinition } from '../block-type';
import { EngineError } from '../errors';
import { DATA_INPUT_HELP, SECONDS_PER_YEAR, series, short } from './data-shared';
import { UNDERCAPACITY_SOURCES } from './transport-capacity';

const M2_PER_YR = SECONDS_PER_YEAR; // m^2/s → m^2/yr
const MM_PER_YR = SECONDS_PER_YEAR * 1000; // m/s → mm/yr

const DISTANCE = 'Distance downstream';

export const channelMarch: BlockTypeDefinition = {
  id: 'channel_march',
  title: 'Downstream march along a surveyed river',
  purpose: 'Capacity, sediment flux and bed erosion or deposition reach by reach down a measured long profile.',
  formula: {
    text:
      'reach i (row i to i+1): S_i = (z_i − z_i+1)/dx_i; q_eq,i = K_f·q_w,i·max(S_i, 0); dz/dt_i = −(q_eq,i − q_in,i)/(l_f·(1 − φ)); q_out,i = q_in,i + (q_eq,i − q_in,i)·dx_i/l_f; q_w = discharge or runoff·A/width',
    tex: 'q_{out,i} = q_{in,i} + (q_{eq,i} - q_{in,i})\\,\\frac{\\Delta x_i}{l_f}',
  },
  sources: [
    ...UNDERCAPACITY_SOURCES,
    'Exner (1925); Paola & Voller (2005) JGR 110:F04014 (porosity in the volume balance)',
  ],
  inputs: [
    {
      name: 'data',
      label: 'Long profile',
      dimension: 'dataset',
      datasetKind: 'long_profile',
      help: `${DATA_INPUT_HELP} Kind long_profile: distance downstream, elevation, and either discharge per unit width or drainage area.`,
    },
    {
      name: 'coefficient',
      label: 'Capacity coefficient K_f',
      symbol: 'K_f',
      dimension: 'dimensionless',
      range: { min: 0, text: '≥ 0' },
      help: 'Dimensionless transport coefficient in q_eq = K_f·q_w·S, typically 0.01–0.1 (from memory; calibrate locally).',
    },
    {
      name: 'length_scale',
      label: 'Length scale l_f',
      symbol: 'l_f',
      dimension: 'length',
      unitHint: 'km',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Erosion/deposition length scale: ≲1 km near transport-limited (alluvial), tens to hundreds of km near detachment-limited (bedrock). Every reach must be shorter than it.',
    },
    {
      name: 'incoming_flux',
      label: 'Incoming sediment flux q_top',
      symbol: 'q_top',
      dimension: 'area_per_time',
      default: '0 m^2/yr',
      unitHint: 'm^2/yr',
      range: { min: 0, text: '≥ 0' },
      help: 'Sediment volume flux per unit width entering the first reach (area per time). Default 0.',
    },
    {
      name: 'porosity',
      label: 'Bed porosity φ',
      symbol: 'φ',
      dimension: 'dimensionless',
      default: '0',
      range: { min: 0, max: 1, maxExclusive: true, text: '0 ≤ φ < 1' },
      help: 'Porosity of the bed when fluxes are solid volumes (Exner); 0 for bedrock or bulk-volume fluxes. Deposits are often 0.3–0.5.',
    },
    {
      name: 'runoff',
      label: 'Runoff rate R',
      symbol: 'R',
      dimension: 'velocity',
      optional: true,
      unitHint: 'm/yr',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Effective runoff (length per time), only and always with a drainage_area dataset: q_w = R·A/width.',
    },
    {
      name: 'width',
      label: 'Channel width W',
      symbol: 'W',
      dimension: 'length',
      optional: true,
      unitHint: 'm',
      range: { min: 0, minExclusive: true, text: '> 0' },
      help: 'Channel width, only and always with a drainage_area dataset.',
    },
  ],
  outputs: [
    { name: 'outgoing_flux', label: 'Outgoing sediment flux', unit: 'm^2/yr', kind: 'quantity', description: 'q_out of the last reach, per unit width.' },
    { name: 'eroded_volume_rate', label: 'Eroded volume rate', unit: 'm^2/yr', kind: 'quantity', description: 'Σ |dz/dt_i|·dx_i over eroding reaches (bulk bed volume per unit width).' },
    { name: 'deposited_volume_rate', label: 'Deposited volume rate', unit: 'm^2/yr', kind: 'quantity', description: 'Σ dz/dt_i·dx_i over aggrading reaches (bulk bed volume per unit width).' },
    { name: 'net_volume_rate', label: 'Net volume rate', unit: 'm^2/yr', kind: 'quantity', description: 'Deposited − eroded.' },
    { name: 'mean_dz_dt', label: 'Mean rate of bed change', unit: 'mm/yr', kind: 'quantity', description: 'Σ dz/dt_i·dx_i / Σ dx_i; negative is lowering.' },
    { name: 'max_erosion_rate', label: 'Maximum erosion rate', unit: 'mm/yr', kind: 'quantity', description: 'max(0, max(−dz/dt_i)).' },
    { name: 'reaches', label: 'Reaches', unit: '', kind: 'quantity', description: 'Rows − 1.' },
  ],
  series: [
    { name: 'capacity', label: 'Transport capacity', points: 0, xLabel: DISTANCE, yLabel: 'Capacity q_eq', xUnit: 'm', yUnit: 'm^2/yr', description: 'At the head of each reach.' },
    { name: 'flux', label: 'Sediment flux', points: 0, xLabel: DISTANCE, yLabel: 'Sediment flux q_s', xUnit: 'm', yUnit: 'm^2/yr', description: 'At every row: q_top, then q_out of each reach.' },
    { name: 'dz_dt', label: 'Bed change', points: 0, xLabel: DISTANCE, yLabel: 'dz/dt', xUnit: 'm', yUnit: 'mm/yr', description: 'At the head of each reach; negative is erosion.' },
  ],
  validity: [
    'Per-unit-width volume fluxes; one explicit step downstream per reach (P10\'s scheme), first order in dx/l_f: every reach shorter than l_f, and well below l_f/2 for accuracy.',
    'A snapshot of rates on the present profile: the profile is not evolved.',
    'Reverse slopes (S < 0) carry no capacity (q_eq = 0).',
  ],
  cautions: [
    'l_f and K_f are model parameters, poorly constrained by observation; test the sensitivity of the rates to both.',
    'The exponential-relaxation variant of the same law gives rates 10–50 % different at dx/l_f = 0.25: the scheme is part of the result.',
    'Slopes from DEM long profiles are noisy; smooth or average the profile over reaches longer than the DEM error allows.',
    STANDING_CAUTION,
  ],
  warnings: [
    'Reverse slope on some reaches: capacity set to 0 there.',
    'A reach longer than half the length scale: the first-order scheme is inaccurate.',
    'Drainage area decreasing downstream.',
  ],
  example: {
    inputs: {
      data: 'dataset("bfa828e8057d6b4bca2bbba8e9047badff62e403f0419c751bcc3588f103ff4a")',
      coefficient: '0.01',
      length_scale: '2000 m',
      incoming_flux: '1 m^2/yr',
    },
    datasets: {
      bfa828e8057d6b4bca2bbba8e9047badff62e403f0419c751bcc3588f103ff4a: {
        columns: [
          { name: 'distance', unit: 'm' },
          { name: 'elevation', unit: 'm' },
          { name: 'discharge', unit: 'm^2/yr' },
        ],
        format: 'denudata-dataset@1',
        kind: 'long_profile',
        rows: [
          [0, 122.5, 10000],
          [500, 112.5, 20000],
          [1000, 106.5, 30000],
          [1500, 102.5, 40000],
          [2000, 100.5, 50000],
          [2500, 100, 60000],
        ],
      },
    },
    output: 'outgoing_flux',
    expected: { value: 1.4111328125, unit: 'm^2 / yr', relTol: 1e-9 },
    source: 'reference cases P10 and P46 (Beaumont, Fullsack & Hamilton 1992; Kooi & Beaumont 1994)',
  },
  expressionFunction: false,
  evaluate(inputs, other) {
    const data = other.data.data!;
    const x = data.columns.distance!;
    const z = data.columns.elevation!;
    const area = data.columns.drainage_area;
    const discharge = data.columns.discharge;
    const n = data.count;
    const measured = series(x, z, { xLabel: DISTANCE, yLabel: 'Elevation', xUnit: 'm', yUnit: 'm' });
    const fail = (message: string): never => {
      throw new BlockFailure(message, { measured });
    };
    const kf = required(inputs, 'coefficient');
    const lf = required(inputs, 'length_scale');
    const qTop = required(inputs, 'incoming_flux');
    const porosity = required(inputs, 'porosity');
    const runoff = inputs.runoff?.si;
    const width = inputs.width?.si;
    if (area) {
      if (runoff === undefined || width === undefined) {
        fail('a drainage_area dataset needs both runoff and width (q_w = runoff·A/width)');
      }
    } else if (runoff !== undefined || width !== undefined) {
      fail('runoff and width apply only to a drainage_area dataset; this dataset gives discharge per unit width');
    }
    if (!area && !discharge) throw new EngineError('data: the long profile has neither discharge nor drainage_area');
    if (n < 2) fail('a long profile needs at least 2 rows');

    const reaches = n - 1;
    const capacity = new Float64Array(reaches);
    const dzdt = new Float64Array(reaches);
    const flux = new Float64Array(n);
    flux[0] = qTop;
    let reverse = 0;
    let firstReverse = 0;
    let longReaches = 0;
    let maxRatio = 0;
    let areaDrops = 0;
    let firstAreaDrop = 0;
    let eroded = 0;
    let deposited = 0;
    let sumRate = 0;
    let sumDx = 0;
    let maxErosion = 0;
    for (let i = 0; i < reaches; i++) {
      const dx = x[i + 1]! - x[i]!;
      if (dx >= lf) {
        fail(`explicit march needs every reach shorter than length_scale (reach ${i + 1} at distance ${short(x[i]!)} m is ${short(dx)} m long, length_scale ${short(lf)} m)`);
      }
      const ratio = dx / lf;
      if (ratio > 0.5) longReaches++;
      maxRatio = Math.max(maxRatio, ratio);
      const slope = (z[i]! - z[i + 1]!) / dx;
      if (slope < 0) {
        if (reverse === 0) firstReverse = x[i]!;
        reverse++;
      }
      if (area && area[i + 1]! < area[i]!) {
        if (areaDrops === 0) firstAreaDrop = x[i]!;
        areaDrops++;
      }
      const qw = area ? (runoff! * area[i]!) / width! : discharge![i]!;
      const qIn = flux[i]!;
      const qEq = kf * qw * Math.max(slope, 0);
      const rate = -(qEq - qIn) / (lf * (1 - porosity));
      capacity[i] = qEq;
      dzdt[i] = rate;
      flux[i + 1] = qIn + ((qEq - qIn) * dx) / lf;
      if (rate < 0) eroded += -rate * dx;
      else deposited += rate * dx;
      sumRate += rate * dx;
      sumDx += dx;
      maxErosion = Math.max(maxErosion, -rate);
    }

    const warnings: string[] = [];
    if (reverse > 0) {
      warnings.push(`reverse slope on ${reverse} reach(es), first at distance ${short(firstReverse)} m: capacity set to 0`);
    }
    if (longReaches > 0) {
      warnings.push(
        `${longReaches} reach(es) longer than half the length_scale (dx/l_f up to ${short(maxRatio)}): the first-order explicit scheme is inaccurate there; use a finer profile or a longer length_scale`,
      );
    }
    if (areaDrops > 0) {
      warnings.push(`drainage area decreases downstream on ${areaDrops} reach(es), first at distance ${short(firstAreaDrop)} m: check the order and the area column`);
    }

    const heads = x.subarray(0, reaches);
    const scaled = (values: Float64Array, factor: number) => values.map((v) => v * factor);
    return {
      outputs: {
        outgoing_flux: { si: flux[reaches]! },
        eroded_volume_rate: { si: eroded },
        deposited_volume_rate: { si: deposited },
        net_volume_rate: { si: deposited - eroded },
        mean_dz_dt: { si: sumRate / sumDx },
        max_erosion_rate: { si: Math.max(0, maxErosion) },
        reaches: { si: reaches },
      },
      series: {
        capacity: series(heads, scaled(capacity, M2_PER_YR), { xLabel: DISTANCE, yLabel: 'Capacity q_eq', xUnit: 'm', yUnit: 'm^2/yr' }),
        flux: series(x, scaled(flux, M2_PER_YR), { xLabel: DISTANCE, yLabel: 'Sediment flux q_s', xUnit: 'm', yUnit: 'm^2/yr' }),
        dz_dt: series(heads, scaled(dzdt, MM_PER_YR), { xLabel: DISTANCE, yLabel: 'dz/dt', xUnit: 'm', yUnit: 'mm/yr' }),
      },
      warnings,
    };
  },
};
