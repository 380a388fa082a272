import { act, renderHook } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { LENGTH_UNIT_STORAGE_KEY, useLengthUnit } from './use-length-unit';

describe('the unit lengths are shown in', () => {
  it('is millimetres until chosen, and a choice reaches every page that shows lengths and the next visit', () => {
    const studio = renderHook(() => useLengthUnit());
    const job = renderHook(() => useLengthUnit());
    expect(studio.result.current[0]).toBe('mm');
    act(() => studio.result.current[1]('in'));
    expect(job.result.current[0]).toBe('in');
    studio.unmount();
    job.unmount();
    expect(renderHook(() => useLengthUnit()).result.current[0]).toBe('in');
  });

  it('follows a choice made in another tab, and reads anything unknown as millimetres', () => {
    const page = renderHook(() => useLengthUnit());
    act(() => {
      window.localStorage.setItem(LENGTH_UNIT_STORAGE_KEY, 'in');
      window.dispatchEvent(new StorageEvent('storage', { key: LENGTH_UNIT_STORAGE_KEY }));
    });
    expect(page.result.current[0]).toBe('in');
    act(() => {
      window.localStorage.setItem(LENGTH_UNIT_STORAGE_KEY, 'furlong');
      window.dispatchEvent(new StorageEvent('storage', { key: LENGTH_UNIT_STORAGE_KEY }));
    });
    expect(page.result.current[0]).toBe('mm');
  });
});
