/** Where the browser fetches the block catalog of a version (the sheet page preloads the same address). */
export const catalogUrl = (version: string) => `/api/catalog?v=${encodeURIComponent(version)}`;
