'use client';

import { useCallback, useLayoutEffect, useRef } from 'react';

/**
 * A stable getter of the latest rendered value, for callbacks that live longer than one render (editor
 * extensions, a registry made once) and run on user events, never during render. The value is written in a
 * layout effect, so it is current before the browser paints and before any event can reach those callbacks.
 */
export function useLatest<T>(value: T): () => T {
  const ref = useRef(value);
  useLayoutEffect(() => {
    ref.current = value;
  });
  return useCallback(() => ref.current, []);
}
