import { encodedSize, type EncodedBody } from './encoded-body';
import { ResultsBodyCache } from './results-body-cache';

/** A body of `n` bytes in each encoding (3n in all). */
function body(n: number, fill = 1): EncodedBody {
  return { json: Buffer.alloc(n, fill), gzip: Buffer.alloc(n, fill), br: Buffer.alloc(n, fill) };
}

describe('ResultsBodyCache', () => {
  it('builds once, then answers with the same body', async () => {
    const cache = new ResultsBodyCache(10_000);
    const build = jest.fn(async () => body(100));
    const first = await cache.get('run-1 results', build);
    const second = await cache.get('run-1 results', build);
    expect(second).toBe(first);
    expect(build).toHaveBeenCalledTimes(1);
    expect(cache.stats()).toEqual({
      hits: 1,
      misses: 1,
      entries: 1,
      bytes: encodedSize(first) + 'run-1 results'.length,
    });
  });

  it('shares one build among concurrent misses of a key', async () => {
    const cache = new ResultsBodyCache(10_000);
    let release: (b: EncodedBody) => void = () => undefined;
    const build = jest.fn(() => new Promise<EncodedBody>((done) => (release = done)));
    const waiting = [cache.get('k', build), cache.get('k', build), cache.get('k', build)];
    release(body(10));
    const bodies = await Promise.all(waiting);
    expect(build).toHaveBeenCalledTimes(1);
    expect(new Set(bodies).size).toBe(1);
  });

  it('keeps nothing of a failed build, so the next request builds again', async () => {
    const cache = new ResultsBodyCache(10_000);
    await expect(
      cache.get('k', async () => {
        throw new Error('no such run');
      }),
    ).rejects.toThrow('no such run');
    expect(cache.stats().entries).toBe(0);
    await expect(cache.get('k', async () => body(5))).resolves.toEqual(body(5));
  });

  it('stays within its bytes by dropping the least recently used bodies first', async () => {
    // Keys of one character: each entry costs 3 × 100 + 1 bytes; three fit in 1,000.
    const cache = new ResultsBodyCache(1_000);
    await cache.get('a', async () => body(100, 1));
    await cache.get('b', async () => body(100, 2));
    await cache.get('c', async () => body(100, 3));
    await cache.get('a', async () => body(100, 9)); // a used again: b is now the oldest
    await cache.get('d', async () => body(100, 4));
    expect(cache.stats()).toMatchObject({ entries: 3, bytes: 903 });
    const rebuilt = jest.fn(async () => body(100, 7));
    await cache.get('b', rebuilt);
    expect(rebuilt).toHaveBeenCalledTimes(1);
    // When b came back, c was the oldest and went; a, used again earlier, is still the first body.
    const a = await cache.get('a', async () => body(100, 8));
    expect(a.json[0]).toBe(1);
    const c = jest.fn(async () => body(100, 3));
    await cache.get('c', c);
    expect(c).toHaveBeenCalledTimes(1);
    expect(cache.stats().bytes).toBeLessThanOrEqual(1_000);
  });

  it('sends but does not keep a body larger than the whole cache', async () => {
    const cache = new ResultsBodyCache(100);
    const big = await cache.get('big', async () => body(50));
    expect(big.json).toHaveLength(50);
    expect(cache.stats()).toMatchObject({ entries: 0, bytes: 0 });
  });
});
