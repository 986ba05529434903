// Stands in for 'server-only' outside React Server Components (vitest, scripts).
export {};
