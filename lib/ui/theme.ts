/** The colour theme: stored in localStorage ('denudata-theme') and applied to html[data-theme]. */
export type Theme = 'light' | 'dark';

export function currentTheme(): Theme {
  if (typeof document === 'undefined') return 'light';
  return document.documentElement.dataset.theme === 'dark' ? 'dark' : 'light';
}

export function applyTheme(theme: Theme): void {
  if (theme === 'dark') document.documentElement.dataset.theme = 'dark';
  else delete document.documentElement.dataset.theme;
  try {
    localStorage.setItem('denudata-theme', theme);
  } catch {
    // private mode: the choice lasts for this page only
  }
  window.dispatchEvent(new CustomEvent('denudata-theme', { detail: theme }));
}

export function toggleTheme(): Theme {
  const next: Theme = currentTheme() === 'dark' ? 'light' : 'dark';
  applyTheme(next);
  return next;
}
