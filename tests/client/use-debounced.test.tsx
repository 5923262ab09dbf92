/**
 * The live budget and the model editor's live checks follow typing through useDebounced: a result
 * after a pause, and at least every maxWait while typing goes on (common practice, no source).
 */
import { act, renderHook } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { useDebounced } from '../../src/lib/use-debounced';

describe('useDebounced', () => {
  beforeEach(() => vi.useFakeTimers());
  afterEach(() => vi.useRealTimers());

  it('passes a change after a quiet spell at once, then waits for a pause', () => {
    const { result, rerender } = renderHook(({ v }) => useDebounced(v, 200, 600), { initialProps: { v: 'a' } });
    act(() => vi.advanceTimersByTime(1000));
    rerender({ v: 'ab' });
    act(() => vi.advanceTimersByTime(0));
    expect(result.current).toBe('ab');
    rerender({ v: 'abc' });
    act(() => vi.advanceTimersByTime(150));
    expect(result.current).toBe('ab');
    act(() => vi.advanceTimersByTime(50));
    expect(result.current).toBe('abc');
  });

  it('while typing never pauses, still updates at least every maxWait', () => {
    const { result, rerender } = renderHook(({ v }) => useDebounced(v, 200, 600), { initialProps: { v: 0 } });
    act(() => vi.advanceTimersByTime(1000));
    const seen: number[] = [];
    for (let i = 1; i <= 30; i++) {
      rerender({ v: i });
      act(() => vi.advanceTimersByTime(100)); // a keystroke every 100 ms, never a 200 ms pause
      seen.push(result.current);
    }
    // 3 s of typing: the value moved on several times, never more than 600 ms behind.
    expect(new Set(seen).size).toBeGreaterThanOrEqual(5);
    for (let i = 0; i < seen.length; i++) expect(i + 1 - seen[i]!).toBeLessThanOrEqual(6);
  });
});
