/**
 * Demo sheets: worked calculations for an invented consultancy, Harrow Vale Geoscience, at five
 * fictional sites. The values are plausible (within the published ranges the block types cite)
 * but invented; they describe no real place. Each sheet is in its own file (lib/demo/sheet-<key>.ts); the
 * surveyed-data sheet is lib/demo/data-sheets.ts.
 */
import type { SheetDocument } from '../engine';
import { emberRidgeScarp } from './sheet-ember-ridge-scarp';
import { quillanHillSlope } from './sheet-quillan-hill-slope';
import { sorrelRiverReach } from './sheet-sorrel-river-reach';
import { marrowRangeExhumation } from './sheet-marrow-range-exhumation';
import { tarnholtMassifBudget } from './sheet-tarnholt-massif-budget';

export interface DemoSite {
  name: string;
  latitude?: number;
  longitude?: number;
  notes?: string;
}

export interface DemoSheet {
  key: string;
  title: string;
  site: DemoSite;
  document: SheetDocument;
}

export const DEMO_SHEETS: DemoSheet[] = [emberRidgeScarp, quillanHillSlope, sorrelRiverReach, marrowRangeExhumation, tarnholtMassifBudget];

/** The same list under a camel-case name. */
export const demoSheets = DEMO_SHEETS;
