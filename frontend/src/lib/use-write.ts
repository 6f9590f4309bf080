import { useSWRConfig, type ScopedMutator } from 'swr';

/**
 * A write to the server as a hook: `send` makes the request, then `refresh` tells the SWR
 * cache what changed (store the answer under its key, or ask a list again); the answer is
 * returned once the cache is up to date.
 */
export function useWrite<Args extends unknown[], Result>(
  send: (...args: Args) => Promise<Result>,
  refresh: (mutate: ScopedMutator, result: Result, ...args: Args) => Promise<unknown>,
): (...args: Args) => Promise<Result> {
  const { mutate } = useSWRConfig();
  return async (...args: Args) => {
    const result = await send(...args);
    await refresh(mutate, result, ...args);
    return result;
  };
}
