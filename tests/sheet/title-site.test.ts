import { describe, expect, it } from 'vitest';
import { readTitleSite, withTitleSite } from '@/lib/sheet/title-site';
import type { SheetDocument } from '@/lib/sheet/types';

const form = (values: Partial<{ title: string; name: string; latitude: string; longitude: string; notes: string }>) => ({
  title: 'Ridge sheet',
  name: '',
  latitude: '',
  longitude: '',
  notes: '',
  ...values,
});

// Limits are those of the sheet document's schema (CONTRACT §1; lib/engine/document.ts): title 1–200
// characters, latitude within ±90 and longitude within ±180 decimal degrees (WGS 84 convention).
describe('readTitleSite', () => {
  it('should read a title and a full site, trimming text and accepting a decimal comma', () => {
    expect(readTitleSite(form({ title: '  North ridge  ', name: ' North ridge ', latitude: '52,25', longitude: '-1.75', notes: ' Crest. ' }))).toEqual({
      title: 'North ridge',
      site: { name: 'North ridge', latitude: 52.25, longitude: -1.75, notes: 'Crest.' },
      errors: {},
    });
  });

  it('should give no site when its fields are empty', () => {
    const read = readTitleSite(form({}));
    expect(read.site).toBeUndefined();
    expect(read.title).toBe('Ridge sheet');
  });

  it('should accept the limits of latitude and longitude exactly', () => {
    expect(readTitleSite(form({ name: 'Pole', latitude: '-90', longitude: '180' })).site).toEqual({ name: 'Pole', latitude: -90, longitude: 180 });
  });

  it('should refuse an empty or too long title, out-of-range or non-numeric coordinates, and a position without a site name', () => {
    expect(readTitleSite(form({ title: '   ' })).errors.title).toBe('Enter a title.');
    expect(readTitleSite(form({ title: 'x'.repeat(201) })).errors.title).toBe('Use at most 200 characters.');
    expect(readTitleSite(form({ name: 'A', latitude: '90.5' })).errors.latitude).toBe('Latitude is between -90 and 90');
    expect(readTitleSite(form({ name: 'A', longitude: '-180.01' })).errors.longitude).toBe('Longitude is between -180 and 180');
    expect(readTitleSite(form({ name: 'A', latitude: '52 N' })).errors.latitude).toMatch(/decimal degrees/);
    const orphan = readTitleSite(form({ latitude: '52.1' }));
    expect(orphan.errors.name).toBe('Name the site to keep its position and notes.');
    expect(orphan.title).toBeUndefined();
  });
});

describe('withTitleSite', () => {
  const doc: SheetDocument = {
    format: 'denudata-sheet@1',
    title: 'Old',
    site: { name: 'Old site', latitude: 1, longitude: 2 },
    blocks: [{ id: 'a', name: 'first', type: 'formula', inputs: { expr: '1 m' } }],
  };

  it('should replace the title and site and keep the blocks and the key order', () => {
    const next = withTitleSite(doc, 'New', { name: 'New site' });
    expect(next).toEqual({ format: 'denudata-sheet@1', title: 'New', site: { name: 'New site' }, blocks: doc.blocks });
    expect(Object.keys(next)).toEqual(['format', 'title', 'site', 'blocks']);
    expect(doc.title).toBe('Old');
  });

  it('should remove the site when none is given', () => {
    expect(withTitleSite(doc, 'New', undefined)).toEqual({ format: 'denudata-sheet@1', title: 'New', blocks: doc.blocks });
  });
});
