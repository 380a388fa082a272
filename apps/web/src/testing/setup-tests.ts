import '@testing-library/jest-dom/vitest';
import { cleanup, configure } from '@testing-library/react';
import { afterEach } from 'vitest';

// MUI's first render in jsdom is slow on a busy two-core machine: give findBy/waitFor room.
configure({ asyncUtilTimeout: 10_000 });

afterEach(() => {
  cleanup();
  window.localStorage.clear();
});
