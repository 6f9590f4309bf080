import { useCallback, useState, type SetStateAction } from 'react';

/** What `PagedTable` needs to show one page and move to another. */
export interface Paging {
  page: number;
  pageSize: number;
  onPageChange: (page: number) => void;
}

/** A server-paged list's place: its filter and which page of it is shown. */
export interface PagedList<Filter> {
  filter: Filter;
  /** A new filter (or a change of the current one) starts again at page 1. */
  setFilter: (next: SetStateAction<Filter>) => void;
  page: number;
  pageSize: number;
  /** Spread into `PagedTable`. */
  paging: Paging;
}

/**
 * The one owner of a paged list's page and filter (team, outbox, reports, signed reports,
 * worker tokens): one state, so a filter change and its return to page 1 are one update.
 */
export function usePagedList(pageSize: number): PagedList<undefined>;
export function usePagedList<Filter>(pageSize: number, initialFilter: Filter): PagedList<Filter>;
export function usePagedList<Filter>(pageSize: number, initialFilter?: Filter) {
  const [{ filter, page }, setState] = useState({ filter: initialFilter, page: 1 });
  const setFilter = useCallback(
    (next: SetStateAction<Filter | undefined>) =>
      setState((current) => ({
        filter:
          typeof next === 'function'
            ? (next as (current: Filter | undefined) => Filter | undefined)(current.filter)
            : next,
        page: 1,
      })),
    [],
  );
  const onPageChange = useCallback(
    (next: number) => setState((current) => ({ ...current, page: next })),
    [],
  );
  return { filter, setFilter, page, pageSize, paging: { page, pageSize, onPageChange } };
}
