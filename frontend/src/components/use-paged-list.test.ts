import { act, renderHook } from '@testing-library/react';
import { usePagedList } from './use-paged-list';

describe('usePagedList', () => {
  it('starts at page 1 with the filter given and the page size in its paging', () => {
    const { result } = renderHook(() => usePagedList<'all' | 'sent'>(25, 'all'));
    expect(result.current.filter).toBe('all');
    expect(result.current.page).toBe(1);
    expect(result.current.paging).toMatchObject({ page: 1, pageSize: 25 });
  });

  it('moves between pages and keeps the filter', () => {
    const { result } = renderHook(() => usePagedList<'all' | 'sent'>(25, 'sent'));
    act(() => result.current.paging.onPageChange(3));
    expect(result.current.page).toBe(3);
    expect(result.current.paging.page).toBe(3);
    expect(result.current.filter).toBe('sent');
  });

  it('goes back to page 1 when the filter changes, as a value or from the current one', () => {
    const { result } = renderHook(() =>
      usePagedList<{ q?: string; role?: string }>(20, { role: 'analyst' }),
    );
    act(() => result.current.paging.onPageChange(4));
    act(() => result.current.setFilter((current) => ({ ...current, q: 'ada' })));
    expect(result.current.filter).toEqual({ role: 'analyst', q: 'ada' });
    expect(result.current.page).toBe(1);
    act(() => result.current.paging.onPageChange(2));
    act(() => result.current.setFilter({}));
    expect(result.current.filter).toEqual({});
    expect(result.current.page).toBe(1);
  });

  it('pages a list without a filter', () => {
    const { result } = renderHook(() => usePagedList(10));
    expect(result.current.filter).toBeUndefined();
    act(() => result.current.paging.onPageChange(2));
    expect(result.current.page).toBe(2);
  });

  it('keeps its page-change function from render to render (a stable prop)', () => {
    const { result, rerender } = renderHook(() => usePagedList(10));
    const first = result.current.paging.onPageChange;
    rerender();
    expect(result.current.paging.onPageChange).toBe(first);
  });
});
