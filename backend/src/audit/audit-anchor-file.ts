import { createHash, KeyObject } from 'node:crypto';
import {
  closeSync,
  createReadStream,
  existsSync,
  fstatSync,
  fsyncSync,
  openSync,
  readFileSync,
  readSync,
  statSync,
  writeSync,
} from 'node:fs';
import { join } from 'node:path';
import { createInterface } from 'node:readline';
import { canonicalJson } from './audit-chain';
import { signMessage, verifyMessage } from './audit-anchor-key';

/** Where the anchors live, relative to DATA_DIR (the backup copies both). */
export const ANCHOR_FILE_NAME = 'audit-anchors.jsonl';
export const ANCHOR_KEY_FILE = 'secrets/audit-anchor-ed25519.pem';

export function anchorPaths(dataDir: string): { anchorFile: string; keyFile: string } {
  return { anchorFile: join(dataDir, ANCHOR_FILE_NAME), keyFile: join(dataDir, ANCHOR_KEY_FILE) };
}

/**
 * Why a line was written: the key was just created (line 1 of a new installation), the file was
 * found missing although the key existed, N entries, M seconds, or a clean shutdown.
 */
export const ANCHOR_REASONS = [
  'key-created',
  'file-missing',
  'entries',
  'interval',
  'shutdown',
] as const;
export type AnchorReason = (typeof ANCHOR_REASONS)[number];

/** What a line says; `sig` signs all of it. */
export interface AnchorBody {
  /** Format version. */
  v: 1;
  /** Line number, 1 = first. */
  n: number;
  /** The newest entry of the trail when the line was written (0: empty trail). */
  seq: number;
  /** That entry's hash (GENESIS_HASH for an empty trail). */
  hash: string;
  at: string;
  reason: AnchorReason;
  /** SHA-256 (hex) of the previous line's exact text; GENESIS_HASH on line 1. */
  prev: string;
  /** Fingerprint of the signing key. */
  key: string;
}

export interface AnchorLine extends AnchorBody {
  /** Ed25519 signature (base64) of ANCHOR_SIGNING_CONTEXT + canonical JSON of the body. */
  sig: string;
}

// Domain separation: a signature over an anchor can never be mistaken for one over other data.
export const ANCHOR_SIGNING_CONTEXT = 'gyre-audit-anchor-v1\n';

export function anchorMessage(body: AnchorBody): string {
  return ANCHOR_SIGNING_CONTEXT + canonicalJson(body);
}

/** The line's text: canonical JSON of the body with its signature, no newline. */
export function signedLine(body: AnchorBody, privateKey: KeyObject): string {
  return canonicalJson({ ...body, sig: signMessage(privateKey, anchorMessage(body)) });
}

export function lineHash(raw: string): string {
  return createHash('sha256').update(raw, 'utf8').digest('hex');
}

const HEX64 = /^[0-9a-f]{64}$/;

/** Parses one line; says in words what is wrong with it when it is not a checkpoint. */
export function parseLine(raw: string): { line: AnchorLine } | { error: string } {
  let value: unknown;
  try {
    value = JSON.parse(raw);
  } catch {
    return { error: raw.trim() === '' ? 'it is empty' : 'it is not JSON' };
  }
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    return { error: 'it is not a JSON object' };
  }
  const r = value as Record<string, unknown>;
  const wrong: string[] = [];
  if (r.v !== 1) wrong.push('v (1 expected)');
  if (!isCount(r.n) || r.n < 1) wrong.push('n');
  if (!isCount(r.seq)) wrong.push('seq');
  if (typeof r.hash !== 'string' || !HEX64.test(r.hash)) wrong.push('hash');
  if (typeof r.at !== 'string' || Number.isNaN(Date.parse(r.at))) wrong.push('at');
  if (!(ANCHOR_REASONS as readonly unknown[]).includes(r.reason)) wrong.push('reason');
  if (typeof r.prev !== 'string' || !HEX64.test(r.prev)) wrong.push('prev');
  if (typeof r.key !== 'string' || !HEX64.test(r.key)) wrong.push('key');
  if (typeof r.sig !== 'string') wrong.push('sig');
  if (wrong.length > 0) return { error: `field ${wrong.join(', ')} missing or malformed` };
  return { line: r as unknown as AnchorLine };
}

function isCount(value: unknown): value is number {
  return typeof value === 'number' && Number.isSafeInteger(value) && value >= 0;
}

export function bodyOf(line: AnchorLine): AnchorBody {
  const { v, n, seq, hash, at, reason, prev, key } = line;
  return { v, n, seq, hash, at, reason, prev, key };
}

/** Whether the line's signature holds under `publicKey` (RFC 8032 verification). */
export function signatureHolds(line: AnchorLine, publicKey: KeyObject): boolean {
  return verifyMessage(publicKey, anchorMessage(bodyOf(line)), line.sig);
}

export interface LastLine {
  raw: string;
  /** Its line number (from the line itself, or counted when it does not parse). */
  n: number;
  line: AnchorLine | null;
}

/** The file's last line, read from its end; null when the file is missing or empty. */
export function readLastLine(file: string): LastLine | null {
  if (!existsSync(file) || statSync(file).size === 0) return null;
  const fd = openSync(file, 'r');
  try {
    const size = fstatSync(fd).size;
    // Lines are well under 1 KiB; 64 KiB from the end holds the last one whole.
    const length = Math.min(size, 64 * 1024);
    const buffer = Buffer.alloc(length);
    readSync(fd, buffer, 0, length, size - length);
    const text = buffer.toString('utf8').replace(/\n$/, '');
    const raw = text.slice(text.lastIndexOf('\n') + 1);
    const parsed = parseLine(raw);
    if ('line' in parsed) return { raw, n: parsed.line.n, line: parsed.line };
    return { raw, n: countLines(file), line: null };
  } finally {
    closeSync(fd);
  }
}

function countLines(file: string): number {
  return readFileSync(file, 'utf8').replace(/\n$/, '').split('\n').length;
}

/** Appends one line and flushes it to disk before returning (file created 0600). */
export function appendLine(file: string, text: string): void {
  const fd = openSync(file, 'a', 0o600);
  try {
    const size = fstatSync(fd).size;
    let prefix = '';
    if (size > 0) {
      const last = Buffer.alloc(1);
      readSyncAt(file, last, size - 1);
      // A line cut off by a crash stays its own (reported) line instead of swallowing this one.
      if (last[0] !== 0x0a) prefix = '\n';
    }
    writeSync(fd, `${prefix}${text}\n`);
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
}

function readSyncAt(file: string, buffer: Buffer, position: number): void {
  const fd = openSync(file, 'r');
  try {
    readSync(fd, buffer, 0, buffer.length, position);
  } finally {
    closeSync(fd);
  }
}

/** Every line of the file as text, in order (none when the file is missing). */
export async function* readLines(file: string): AsyncGenerator<string> {
  if (!existsSync(file)) return;
  const lines = createInterface({ input: createReadStream(file), crlfDelay: Infinity });
  for await (const line of lines) yield line;
}
