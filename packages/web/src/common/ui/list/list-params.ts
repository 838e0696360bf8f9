import { useSearchParams } from 'react-router-dom';

/** A list's order: the server's sort name and its direction. */
export interface ListSort {
  key: string;
  desc: boolean;
}

/** `value` when it is one of `allowed`, else undefined (a hand-edited address falls back). */
export function oneOf<T extends string>(value: string | null, allowed: readonly T[]): T | undefined {
  return allowed.includes(value as T) ? (value as T) : undefined;
}

/**
 * A list's state kept in the address, so a reload or a shared link shows the same view: `page`,
 * `sort` with `order`, and each filter under its own name. Changing a filter or the order goes
 * back to the first page; the address is replaced, not pushed, so Back leaves the list.
 */
export function useListParams({
  sort: defaultSort,
  sorts,
  pageSize = 20,
}: { sort?: ListSort; sorts?: readonly string[]; pageSize?: number } = {}) {
  const [search, setSearch] = useSearchParams();
  const page = Math.max(1, Math.floor(Number(search.get('page'))) || 1);
  const key = search.get('sort');
  const sort: ListSort | undefined =
    key && (!sorts || sorts.includes(key)) ? { key, desc: search.get('order') === 'desc' } : defaultSort;

  const update = (changes: Record<string, string | undefined>) => {
    const next = new URLSearchParams(search);
    for (const [k, v] of Object.entries(changes)) {
      if (v === undefined || v === '') next.delete(k);
      else next.set(k, v);
    }
    if (!('page' in changes)) next.delete('page');
    setSearch(next, { replace: true });
  };

  return {
    search,
    page,
    pageSize,
    sort,
    update,
    setPage: (p: number) => update({ page: p > 1 ? String(p) : undefined }),
    setSort: (s: ListSort) => update({ sort: s.key, order: s.desc ? 'desc' : 'asc' }),
    /** Drops every filter, keeping only the named keys. */
    clear: (keep: Record<string, string> = {}) => setSearch(new URLSearchParams(keep), { replace: true }),
  };
}

export type ListParams = ReturnType<typeof useListParams>;

/** One choice of a list's filter: its value in the address and its button's words. */
export interface FilterOption<T extends string> {
  value: T;
  label: string;
}

/**
 * The list's filter `name` as the address gives it when it is one of `options`, else the first
 * option (the default, which the address leaves out).
 */
export function filterValue<T extends string>(
  list: ListParams,
  name: string,
  options: ReadonlyArray<FilterOption<T>>,
): T {
  return (
    oneOf(
      list.search.get(name),
      options.map((o) => o.value),
    ) ?? options[0]!.value
  );
}
