import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { basicSetup, minimalSetup } from '@/lib/editor/basic-setup-off';

// The expression fields use @uiw/react-codemirror with basicSetup off; next.config.mjs replaces the basic setup
// and the dark theme the package imports statically with modules that are never used (DEVELOPERS.md, "Editor
// package"). These checks keep that replacement honest if the package or the config changes.
const root = path.resolve(__dirname, '../..');

describe('the editor package without its basic setup', () => {
  it('should refuse loudly if anything asks for the basic setup', () => {
    expect(() => basicSetup()).toThrow(/basicSetup is not bundled/);
    expect(() => minimalSetup()).toThrow(/minimalSetup is not bundled/);
  });

  it('should alias exactly the modules @uiw/react-codemirror imports for them, to files that exist', async () => {
    const { default: nextConfig } = (await import(path.join(root, 'next.config.mjs'))) as { default: unknown };
    const aliases = (nextConfig as { turbopack?: { resolveAlias?: Record<string, string> } }).turbopack?.resolveAlias ?? {};
    expect(Object.keys(aliases).sort()).toEqual(['@codemirror/theme-one-dark', '@uiw/codemirror-extensions-basic-setup']);
    for (const target of Object.values(aliases)) expect(existsSync(path.join(root, target)), target).toBe(true);
    const defaults = readFileSync(path.join(root, 'node_modules/@uiw/react-codemirror/esm/getDefaultExtensions.js'), 'utf8');
    expect(defaults).toContain("from '@uiw/codemirror-extensions-basic-setup'");
    expect(defaults).toContain("from '@codemirror/theme-one-dark'");
    // basicSetup is only called when the option is on; the field turns it off.
    expect(defaults).toMatch(/if \(defaultBasicSetup\)/);
    const field = readFileSync(path.join(root, 'components/blocks/expression-field.tsx'), 'utf8');
    expect(field).toContain('basicSetup={false}');
    expect(field).toContain('theme="none"');
  });
});
