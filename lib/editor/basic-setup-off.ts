/**
 * Stands in for `@uiw/codemirror-extensions-basic-setup` in the browser bundle (next.config.mjs,
 * `turbopack.resolveAlias`). @uiw/react-codemirror imports its basic setup statically even when a field passes
 * `basicSetup={false}`, and that setup brings the history, search, lint and folding packages: about 30 kB
 * compressed on the sheet page, which its 420 kB ceiling has no room for. Our expression fields never use it
 * (they list their own extensions), so it is replaced by this module, which refuses loudly if anything asks.
 * DEVELOPERS.md, "Editor package", has the measurement.
 */
import type { Extension } from '@codemirror/state';

function off(name: string): never {
  throw new Error(`${name} is not bundled in Denudata: pass basicSetup={false} and list the extensions a field needs (lib/editor/basic-setup-off.ts).`);
}

export interface BasicSetupOptions {
  [option: string]: boolean | undefined;
}

export function basicSetup(_options?: BasicSetupOptions): Extension {
  return off('basicSetup');
}

export function minimalSetup(_options?: BasicSetupOptions): Extension {
  return off('minimalSetup');
}
