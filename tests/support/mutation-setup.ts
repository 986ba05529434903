import { inject, vi } from 'vitest';

// Mutation testing only (vitest.mutation.config.ts): test files share one module graph for speed, so a
// mutant that acts while a module loads ("static": a constant, an input declaration, a worked example)
// needs the engine's modules loaded afresh while it is active, and once more after it.
// Stryker's own setup file runs before this one and has already set the active mutant.
const provided = inject as unknown as (key: string) => unknown;
const state = globalThis as { denudataStaticMutantLoaded?: boolean };

if (provided('mode') === 'mutant' && provided('mutantActivation') === 'static') {
  vi.resetModules();
  state.denudataStaticMutantLoaded = true;
} else if (state.denudataStaticMutantLoaded) {
  vi.resetModules();
  state.denudataStaticMutantLoaded = false;
}
