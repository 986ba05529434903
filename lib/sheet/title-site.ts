// Reads the header's title and site form as the sheet document's schema will check them (pure, client-safe).
import type { SiteInfo } from './types';

export type TitleSiteErrors = Partial<Record<'title' | 'name' | 'latitude' | 'longitude' | 'notes', string>>;

function parseCoordinate(text: string, limit: number, word: string): { value?: number; error?: string } {
  const trimmed = text.trim().replace(',', '.');
  if (!trimmed) return {};
  const value = Number(trimmed);
  if (!Number.isFinite(value)) return { error: `${word} is a number in decimal degrees, e.g. ${limit === 90 ? '46.2174' : '-121.5126'}` };
  if (Math.abs(value) > limit) return { error: `${word} is between -${limit} and ${limit}` };
  return { value };
}

/** Checks the title and site as the sheet document's schema will; returns the new values or field errors. */
export function readTitleSite(values: { title: string; name: string; latitude: string; longitude: string; notes: string }): {
  title?: string;
  site?: SiteInfo;
  errors: TitleSiteErrors;
} {
  const errors: TitleSiteErrors = {};
  const title = values.title.trim();
  if (!title) errors.title = 'Enter a title.';
  else if (title.length > 200) errors.title = 'Use at most 200 characters.';
  const name = values.name.trim();
  const latitude = parseCoordinate(values.latitude, 90, 'Latitude');
  const longitude = parseCoordinate(values.longitude, 180, 'Longitude');
  if (latitude.error) errors.latitude = latitude.error;
  if (longitude.error) errors.longitude = longitude.error;
  const notes = values.notes.trim();
  if (notes.length > 5000) errors.notes = 'Use at most 5000 characters.';
  if (name.length > 200) errors.name = 'Use at most 200 characters.';
  if (!name && (latitude.value !== undefined || longitude.value !== undefined || notes)) {
    errors.name = 'Name the site to keep its position and notes.';
  }
  if (Object.keys(errors).length) return { errors };
  const site: SiteInfo | undefined = name
    ? {
        name,
        ...(latitude.value !== undefined ? { latitude: latitude.value } : {}),
        ...(longitude.value !== undefined ? { longitude: longitude.value } : {}),
        ...(notes ? { notes } : {}),
      }
    : undefined;
  return { title, site, errors };
}


/** The document with a new title and site (no site when `site` is undefined); blocks untouched. */
export function withTitleSite<D extends { title: string; site?: SiteInfo }>(doc: D, title: string, site: SiteInfo | undefined): D {
  const next: D = { ...doc, title };
  if (site) next.site = site;
  else delete next.site;
  return next;
}
