/**
 * Stands in for `@codemirror/theme-one-dark` in the browser bundle (next.config.mjs, `turbopack.resolveAlias`):
 * @uiw/react-codemirror imports it statically for its `theme="dark"`, which we never use (the fields pass
 * `theme="none"` and take their colours from app/globals.css in both of our themes). Empty extensions, so
 * nothing changes if it were ever named.
 */
import type { Extension } from '@codemirror/state';

export const oneDark: Extension = [];
export const oneDarkTheme: Extension = [];
export const oneDarkHighlightStyle: Extension = [];
export const color = {} as Record<string, string>;
