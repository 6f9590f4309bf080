import { isIP } from 'node:net';

/**
 * Which peers may set `X-Forwarded-For` (Express's `trust proxy`): nothing (the default),
 * a hop count, or a list of proxy addresses, CIDR ranges and Express's named ranges.
 */
export type TrustProxy = false | number | string[];

/** The named ranges Express's `trust proxy` (proxy-addr) knows. */
export const TRUST_PROXY_NAMES = ['loopback', 'linklocal', 'uniquelocal'] as const;

export const TRUST_PROXY_EXPECTED =
  "a hop count (e.g. 1) or a comma list of proxy addresses, CIDR ranges or 'loopback', 'linklocal', 'uniquelocal' (e.g. 127.0.0.1,10.0.0.0/8)";

export type TrustProxyParse = { ok: true; value: TrustProxy } | { ok: false; problem: string };

/** Parses TRUST_PROXY; refuses anything that would trust every client's forwarding headers. */
export function parseTrustProxy(raw: string): TrustProxyParse {
  const text = raw.trim();
  if (text === '') return { ok: true, value: false };
  if (/^\d+$/.test(text)) {
    const hops = Number(text);
    return hops >= 1 && Number.isSafeInteger(hops)
      ? { ok: true, value: hops }
      : { ok: false, problem: `hop count ${text} found, 1 or more expected` };
  }
  const entries = text.split(',').map((entry) => entry.trim());
  for (const entry of entries) {
    const problem = entryProblem(entry);
    if (problem !== null) return { ok: false, problem };
  }
  return { ok: true, value: entries };
}

function entryProblem(entry: string): string | null {
  if (entry === '') return 'an empty entry found, an address, CIDR range or range name expected';
  if ((TRUST_PROXY_NAMES as readonly string[]).includes(entry)) return null;
  const [address, prefix, extra] = entry.split('/');
  const family = isIP(address);
  if (family === 0 || extra !== undefined) {
    return `'${entry}' found, ${TRUST_PROXY_EXPECTED} expected`;
  }
  if (prefix === undefined) return null;
  const bits = family === 4 ? 32 : 128;
  if (!/^\d+$/.test(prefix) || Number(prefix) > bits) {
    return `'${entry}' found, a prefix length of 1 to ${bits} expected`;
  }
  // A /0 range is every address: the same as trusting any client.
  if (Number(prefix) === 0) return `'${entry}' found, a range that is not every address expected`;
  return null;
}
