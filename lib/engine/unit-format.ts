/**
 * Outputs in explicit display units with their SI form: unit templates (parsed once), conversion
 * from and to SI, and the formatting of any result value (number, quantity or text).
 */
import type { Unit } from 'mathjs';
import { EngineError } from './errors';
import { math } from './expression';
import { countOf, describeValue } from './units';


/** One formatted output, as the results document holds it. */
export interface FormattedOutput {
  value: number | string;
  unit: string;
  si: number | string;
  siUnit: string;
}

interface UnitTemplate {
  /** The display unit, valueless. */
  display: Unit;
  /** Its SI form, valueless, e.g. "m / s" for "mm / yr". */
  si: Unit;
  siText: string;
  displayText: string;
  /**
   * Whether neither unit has an offset (every unit but the temperature scales), so that
   * converting from SI to the display unit only copies the value (see quantityFromSI).
   */
  noOffset: boolean;
}

type MutableUnit = Unit & { fixPrefix: boolean; skipAutomaticSimplification: boolean };
type UnitParts = { units: Array<{ unit: { offset: number } }> };

function hasNoOffset(unit: Unit): boolean {
  return (unit as unknown as UnitParts).units.every((part) => part.unit.offset === 0);
}

const templates = new Map<string, UnitTemplate | null>();

/** A parsed display unit with its SI form, or null when the text is not a unit. */
export function unitTemplate(text: string): UnitTemplate | null {
  if (templates.has(text)) return templates.get(text)!;
  let template: UnitTemplate | null = null;
  try {
    if (text.length <= 200) {
      const display = math.unit(text);
      if (display.value === null) {
        const si = math.unit(1, text).toSI();
        const siText = si.formatUnits();
        if (siText !== '') {
          const siUnit = math.unit(siText);
          template = { display, si: siUnit, siText, displayText: display.formatUnits(), noOffset: hasNoOffset(display) && hasNoOffset(siUnit) };
        }
      }
    }
  } catch {
    template = null;
  }
  if (templates.size > 2000) templates.clear();
  templates.set(text, template);
  return template;
}

/** Whether two unit texts measure the same dimension. */
export function sameDimension(a: string, b: string): boolean {
  const ta = unitTemplate(a);
  const tb = unitTemplate(b);
  return ta !== null && tb !== null && ta.display.equalBase(tb.display);
}

/**
 * A Unit in SI units holding the given SI value. mathjs keeps a unit's value in SI base units
 * internally, and the SI form has no offset or prefix factor, so the value is set directly on a
 * clone of the cached valueless SI unit (no string parsing on this hot path).
 */
function siUnitWithValue(template: UnitTemplate, si: number): Unit {
  const unit = template.si.clone();
  (unit as Unit & { value: number | null }).value = si;
  return unit;
}

/**
 * Builds a Unit from an SI value, shown in the given display unit. Without offsets, mathjs's
 * Unit.to(display) clones the display unit, copies the (SI) value into it and fixes its prefix;
 * that is done here directly. Temperature scales go through Unit.to.
 */
export function quantityFromSI(si: number, displayUnit: string): Unit {
  const template = unitTemplate(displayUnit);
  if (!template) throw new EngineError(`"${displayUnit}" is not a unit`);
  if (!template.noOffset) return siUnitWithValue(template, si).to(template.display);
  const unit = template.display.clone() as MutableUnit;
  unit.value = si;
  unit.fixPrefix = true;
  unit.skipAutomaticSimplification = true;
  return unit;
}

/**
 * The SI form of each dimension, as Unit.toSI() builds it from the (fixed) SI unit system: its
 * text, and whether every unit in it has a factor (unit value × prefix value) of exactly 1 and
 * no offset. That holds for m, kg, s, A, K, mol, cd, rad and b, and then mathjs's conversion of
 * a quantity without offsets to SI copies its internal value and turning that into a number
 * divides it by 1: the SI value is the internal value, bit for bit (tests/engine/units.test.ts).
 */
interface SiForm {
  text: string;
  unitFactors: boolean;
}

type UnitFactors = { units: Array<{ unit: { value: number; offset: number }; prefix: { value: number } }> };

const siForms = new Map<string, SiForm>();

function siFormOf(unit: Unit): SiForm {
  const key = unit.dimensions.join(',');
  let form = siForms.get(key);
  if (!form) {
    const valueless = unit.clone();
    (valueless as unknown as { value: number | null }).value = null;
    const siUnit = valueless.toSI();
    const unitFactors = (siUnit as unknown as UnitFactors).units.every(
      (part) => part.unit.offset === 0 && part.unit.value * part.prefix.value === 1,
    );
    form = { text: siUnit.formatUnits(), unitFactors };
    if (siForms.size > 2000) siForms.clear();
    siForms.set(key, form);
  }
  return form;
}

/** Formats a mathjs Unit: value in its own unit, plus the SI form. */
export function formatUnit(unit: Unit): FormattedOutput {
  if (typeof unit.value === 'number' && hasNoOffset(unit)) {
    const form = siFormOf(unit);
    if (form.unitFactors) {
      // Equal to unit.toSI().toNumber() and unit.toSI().formatUnits() (see SiForm).
      return { value: unit.toNumber(), unit: unit.formatUnits(), si: unit.value, siUnit: form.text };
    }
  }
  const si = unit.toSI();
  const siUnit = si.formatUnits();
  return {
    value: unit.toNumber(),
    unit: unit.formatUnits(),
    si: si.toNumber(),
    siUnit,
  };
}

/** Formats an SI value in a display unit ("" = dimensionless). */
export function formatFromSI(si: number, displayUnit: string): FormattedOutput {
  if (displayUnit === '') return { value: si, unit: '', si, siUnit: '' };
  return formatUnit(quantityFromSI(si, displayUnit));
}

/**
 * Rebuilds the mathjs value of a formatted output, for use in later expressions. Built from the
 * SI value so that a value read back from stored results is the very same number.
 */
export function valueFromFormatted(output: FormattedOutput): unknown {
  if (typeof output.value === 'string') return output.value;
  if (output.unit === '') return output.si;
  return quantityFromSI(output.si as number, output.unit);
}

/** Formats any evaluated value of a quantities or formula block. */
export function formatValue(value: unknown, displayUnit: string | undefined): FormattedOutput {
  if (typeof value === 'string') return { value, unit: '', si: value, siUnit: '' };
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new EngineError(`the result is not finite (${value})`);
    if (displayUnit !== undefined && displayUnit !== '') {
      throw new EngineError(`the result is a plain number, so it cannot be shown in ${displayUnit}`);
    }
    return { value, unit: '', si: value, siUnit: '' };
  }
  if (math.isUnit(value)) {
    let unit = value as Unit;
    if (unit.value === null) throw new EngineError(`the result is the unit ${unit.formatUnits()} without a value`);
    if (displayUnit !== undefined && displayUnit !== '') {
      const template = unitTemplate(displayUnit);
      if (!template) throw new EngineError(`the display unit "${displayUnit}" is not a unit`);
      if (!unit.equalBase(template.display)) {
        throw new EngineError(`the display unit ${displayUnit} does not fit the result ${describeValue(unit)}`);
      }
      unit = unit.to(template.display);
    } else if (!(unit as Unit & { skipAutomaticSimplification?: boolean }).skipAutomaticSimplification) {
      unit = (unit as Unit & { simplify(): Unit }).simplify();
    }
    const formatted = formatUnit(unit);
    if (!Number.isFinite(formatted.value as number) || !Number.isFinite(formatted.si as number)) {
      throw new EngineError('the result is not finite');
    }
    return formatted;
  }
  if (typeof value === 'boolean') throw new EngineError('the result is true/false; expected a number or a quantity');
  if (math.isMatrix(value) || Array.isArray(value)) {
    throw new EngineError(`the result is a list of ${countOf(value)} values; expected a single value (try sum, mean or max)`);
  }
  if (math.isComplex(value)) throw new EngineError(`the result is a complex number (${describeValue(value)})`);
  throw new EngineError('the result is not a number, quantity or text');
}
