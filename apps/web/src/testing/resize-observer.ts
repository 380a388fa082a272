import { vi } from 'vitest';

/**
 * A ResizeObserver that observes nothing: jsdom measures nothing and has none, and React Three Fiber only needs
 * one to exist. Undo with vi.unstubAllGlobals().
 */
export function stubResizeObserver(): void {
  vi.stubGlobal(
    'ResizeObserver',
    class {
      observe() {}
      unobserve() {}
      disconnect() {}
    },
  );
}
