/**
 * The units of the engine's mathjs instance: the geological time units and atoms, the fixed SI unit
 * system for showing results, and a fast exact answer to "is this name a unit?". Called once, by
 * expression.ts, before the instance is locked.
 */
import type { MathJsInstance } from 'mathjs';
import { EngineError } from './errors';

type UnitTable = Record<string, { prefixes: Record<string, unknown> }>;
const hasOwn = (object: object, key: string): boolean => Object.prototype.hasOwnProperty.call(object, key);

/** Configures the units of `math`; returns mathjs's own unit-name test (for tests to compare with). */
export function configureUnits(math: MathJsInstance): { isValuelessUnitByMathjs: (name: string) => boolean } {
  // The Julian year (365.25 d), with SI-prefixed multiples and the annus forms used for ages
  // (IUPAC–IUGS usage, Holden et al. 2011).
  math.createUnit('yr', { definition: '365.25 day', aliases: ['yrs'] });
  math.createUnit('kyr', { definition: '1000 yr', aliases: ['kyrs', 'ka'] });
  math.createUnit('Myr', { definition: '1e6 yr', aliases: ['Myrs', 'Ma'] });
  math.createUnit('Gyr', { definition: '1e9 yr', aliases: ['Gyrs', 'Ga'] });
  // A count of atoms, dimensionless (CONTRACT §4b): 2.4e5 atoms/g is 2.4e5 per gram. ("at" is the
  // attotonne in mathjs, so 2.4e5 at/g is a plain number; the cosmogenic type refuses it.)
  math.createUnit('atoms', { definition: '1', aliases: ['atom'] });
  // The annus on its own (1 mm/a), the trade's usual unit beside ka, Ma and Ga (CONTRACT §3).
  math.createUnit('a', { definition: '1 yr' });
  // The hectare's symbol (SI Brochure, 9th ed., Table 8: ha = 10^4 m^2), usual for catchment and plot areas;
  // mathjs knows the unit only by its name. Without prefixes, as the annus: "ha" is not hecto-annus.
  math.createUnit('ha', { definition: '1 hectare' });

  // How a result is shown when no display unit is given, fixed for reproducibility.
  // mathjs shows a product, quotient or power of quantities (e.g. (2 J) / (1 s)) through
  // Unit.simplify(), which picks units from the "current unit system". Its default is the "auto"
  // system, and Unit.parse() rewrites that system every time it reads a unit name (reading "hp"
  // makes hp the unit for every power shown afterwards). The unit of a result then depended on
  // what the process had parsed before, in any sheet or quick calculation, and on the engine's
  // caches, so a stored revision could be shown differently on re-evaluation and incremental
  // evaluation could differ from full evaluation. The engine uses the fixed SI system instead:
  // simplify() then depends on the result alone. The rule, as the formula and quantities help
  // states it: a product or quotient of quantities is shown in the SI unit named for its kind
  // when there is one (N, J, W, Pa, Hz, C, V, ...), else in SI base units when that takes fewer
  // unit terms than the units it was computed in (2 ft * 3 ft → 0.557 m^2), else in the units it
  // was computed in (3 m / (2 yr) → 1.5 m / yr); a value written with its unit (1 hp) and a
  // conversion (to) keep their units, and a sum takes its first term's. parse() goes on rewriting
  // "auto", which nothing reads now.
  // setUnitSystem is then refused, so nothing in the process can change the rule again
  // (tests/engine/reproducibility.test.ts).
  math.Unit.setUnitSystem('si');
  (math.Unit as unknown as { setUnitSystem: (name: string) => void }).setUnitSystem = () => {
    throw new EngineError('the unit system of the engine is fixed (SI)');
  };

  // "Is this name a unit?" is asked when a block name is checked, when an expression is walked
  // and when mathjs compiles a symbol. mathjs answers from a 100-entry cache and otherwise tests
  // the name against every unit it knows (endsWith, then the prefix), so in a sheet of more than
  // 100 blocks every compile of a reference such as v123.value paid that scan of the whole unit
  // table. The engine answers the same question by looking up the name's few possible
  // prefix + unit splits in the table, and remembers the answers. The unit table is fixed from
  // here on (createUnit is refused below), so both are exact; tests/engine/expression.test.ts
  // compares the answers with mathjs's own for every unit and prefixed unit.
  const mathjsIsValuelessUnit = math.Unit.isValuelessUnit.bind(math.Unit) as (name: string) => boolean;

  /** mathjs's answer to "is this a unit, with or without a prefix?" (for tests). */
  function isValuelessUnitByMathjs(name: string): boolean {
    return mathjsIsValuelessUnit(name);
  }

  /** The longest unit name and the longest prefix name mathjs knows (the table is fixed). */
  let unitTableBounds: { unit: number; prefix: number } | null = null;

  /** The same answer as mathjs's: the whole name is a unit, or a unit with one of its prefixes. */
  function findsUnit(name: string): boolean {
    const units = math.Unit.UNITS as unknown as UnitTable;
    if (hasOwn(units, name)) return true;
    if (!unitTableBounds) {
      let unit = 0;
      let prefix = 0;
      for (const unitName of Object.keys(units)) {
        unit = Math.max(unit, unitName.length);
        for (const prefixName of Object.keys(units[unitName]!.prefixes)) prefix = Math.max(prefix, prefixName.length);
      }
      unitTableBounds = { unit, prefix };
    }
    // name = prefix + unit name, with a non-empty prefix (the whole name was tried above).
    const last = Math.min(name.length - 1, unitTableBounds.prefix);
    for (let cut = Math.max(1, name.length - unitTableBounds.unit); cut <= last; cut++) {
      const unitName = name.slice(cut);
      if (!hasOwn(units, unitName)) continue;
      const prefixes = units[unitName]!.prefixes;
      const prefix = name.slice(0, cut);
      if (hasOwn(prefixes, prefix) && prefixes[prefix] !== undefined) return true;
    }
    return false;
  }

  const UNIT_NAME_CACHE_LIMIT = 20_000;
  const unitNameAnswers = new Map<string, boolean>();
  (math.Unit as unknown as { isValuelessUnit: (name: string) => boolean }).isValuelessUnit = (name: string): boolean => {
    let answer = unitNameAnswers.get(name);
    if (answer === undefined) {
      answer = typeof name === 'string' ? findsUnit(name) : mathjsIsValuelessUnit(name);
      if (unitNameAnswers.size >= UNIT_NAME_CACHE_LIMIT) unitNameAnswers.clear();
      unitNameAnswers.set(name, answer);
    }
    return answer;
  };
  return { isValuelessUnitByMathjs };
}
