import { act, fireEvent, render, screen } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { SearchFilter } from './filter-bar';

describe('the search box of a list', () => {
  beforeEach(() => {
    vi.useFakeTimers();
  });
  afterEach(() => {
    vi.useRealTimers();
  });

  function renderBox(value: string) {
    const onSearch = vi.fn();
    const view = render(<SearchFilter id="s" label="Search" value={value} onSearch={onSearch} />);
    const box = () => screen.getByRole<HTMLInputElement>('searchbox', { name: 'Search' });
    const rerender = (next: string) =>
      view.rerender(<SearchFilter id="s" label="Search" value={next} onSearch={onSearch} />);
    return { onSearch, box, rerender };
  }

  it('asks once typing pauses, with the last text', () => {
    const { onSearch, box } = renderBox('');
    fireEvent.change(box(), { target: { value: 'ma' } });
    act(() => {
      vi.advanceTimersByTime(100);
    });
    fireEvent.change(box(), { target: { value: 'material' } });
    act(() => {
      vi.advanceTimersByTime(400);
    });
    expect(onSearch.mock.calls).toEqual([['material']]);
  });

  it('keeps what was typed while the address catches up with an earlier search', () => {
    const { onSearch, box, rerender } = renderBox('');
    fireEvent.change(box(), { target: { value: 'machine' } });
    act(() => {
      vi.advanceTimersByTime(400);
    });
    expect(onSearch).toHaveBeenLastCalledWith('machine');
    // New text goes in before the address (a deferred navigation) reports the first search back.
    fireEvent.change(box(), { target: { value: 'material' } });
    rerender('machine');
    expect(box().value).toBe('material');
    act(() => {
      vi.advanceTimersByTime(400);
    });
    expect(onSearch).toHaveBeenLastCalledWith('material');
  });

  it('follows a value changed from outside, such as a cleared filter or Back', () => {
    const { onSearch, box, rerender } = renderBox('machine');
    rerender('');
    expect(box().value).toBe('');
    rerender('kerf');
    expect(box().value).toBe('kerf');
    act(() => {
      vi.advanceTimersByTime(400);
    });
    expect(onSearch).not.toHaveBeenCalled();
  });
});
