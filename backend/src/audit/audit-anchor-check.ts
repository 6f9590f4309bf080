import { KeyObject } from 'node:crypto';
import type { AuditAnchorsCheck, AuditCheckpointView } from '@gyre/shared';
import { GENESIS_HASH } from './audit-chain';
import {
  ANCHOR_FILE_NAME,
  ANCHOR_KEY_FILE,
  AnchorReason,
  lineHash,
  parseLine,
  signatureHolds,
} from './audit-anchor-file';
import { keyFingerprint } from './audit-anchor-key';

/** A correctly signed line of the anchor file. */
export interface SignedCheckpoint extends AuditCheckpointView {
  reason: AnchorReason;
}

/** The anchor file as read and checked on its own, before it is held against the table. */
export interface ReadAnchors {
  lines: number;
  checkpoints: SignedCheckpoint[];
  problems: string[];
  keyFingerprint: string | null;
}

/** The table as it stands: its last entry, and the hash stored at a sequence number. */
export interface TableView {
  lastSeq: number;
  hashAt(seq: number): string | null;
}

/** The first entry the checkpoints show was deleted or rewritten. */
export interface AnchorFinding {
  seq: number;
  reason: string;
}

const MAX_PROBLEMS = 20;

/**
 * Reads the anchor file line by line: each line must parse, name Gyre's key, carry a valid
 * Ed25519 signature (RFC 8032), and link to the text of the line before it.
 */
export async function readAnchors(
  lines: AsyncIterable<string> | Iterable<string>,
  context: { publicKey: KeyObject | null; fileExists: boolean },
): Promise<ReadAnchors> {
  const problems: string[] = [];
  const checkpoints: SignedCheckpoint[] = [];
  const { publicKey, fileExists } = context;
  if (publicKey === null) {
    problems.push(
      fileExists
        ? `The anchor key (${ANCHOR_KEY_FILE}) is missing: the checkpoints cannot be checked, so deleted or rewritten entries cannot be detected.`
        : `Neither the anchor key (${ANCHOR_KEY_FILE}) nor the anchor file (${ANCHOR_FILE_NAME}) exists: deleted or rewritten entries cannot be detected.`,
    );
    return { lines: 0, checkpoints, problems, keyFingerprint: null };
  }
  const fingerprint = keyFingerprint(publicKey);
  if (!fileExists) {
    problems.push(
      `The anchor file (${ANCHOR_FILE_NAME}) is missing or empty although the anchor key exists: every checkpoint was deleted, so deleted or rewritten entries cannot be detected.`,
    );
  }
  let count = 0;
  let previous: string | null = null;
  for await (const raw of lines) {
    count += 1;
    const expectedPrev = previous === null ? GENESIS_HASH : lineHash(previous);
    previous = raw;
    const where = `Line ${count} of the anchor file`;
    const parsed = parseLine(raw);
    if ('error' in parsed) {
      problems.push(`${where} is not a checkpoint (${parsed.error}): it was altered or cut off.`);
      continue;
    }
    const line = parsed.line;
    if (line.key !== fingerprint) {
      problems.push(
        `${where} names another signing key (${short(line.key)}…) than Gyre's anchor key (${short(fingerprint)}…): it was forged or the key was replaced; its checkpoint is ignored.`,
      );
      continue;
    }
    if (!signatureHolds(line, publicKey)) {
      problems.push(
        `${where} is not signed by Gyre's anchor key: it was forged or altered; its checkpoint is ignored.`,
      );
      continue;
    }
    if (line.prev !== expectedPrev) {
      problems.push(
        `${where} does not link to the line before it (its previous-line hash differs): lines were removed, inserted or altered.`,
      );
    } else if (line.n !== count) {
      problems.push(`${where} calls itself line ${line.n}: lines were removed or inserted.`);
    }
    if (line.reason === 'file-missing') {
      problems.push(
        `${where}: Gyre started a new anchor file on ${line.at} because the previous one was missing; the checkpoints before then are lost, so entries up to #${line.seq} cannot be checked against them.`,
      );
    }
    checkpoints.push({
      line: count,
      seq: line.seq,
      hash: line.hash,
      at: line.at,
      reason: line.reason,
    });
  }
  return { lines: count, checkpoints, problems, keyFingerprint: fingerprint };
}

/**
 * Holds every signed checkpoint against the table: a checkpoint beyond the last entry means
 * entries were deleted from the end (truncation); a different hash at a checkpoint's sequence
 * number means the chain up to there was rewritten and re-hashed.
 */
export function compareWithTable(
  read: ReadAnchors,
  table: TableView,
): { check: AuditAnchorsCheck; finding: AnchorFinding | null } {
  const problems = [...read.problems];
  const findings: AnchorFinding[] = [];
  let latest: SignedCheckpoint | null = null;
  for (const checkpoint of read.checkpoints) {
    if (latest === null || checkpoint.seq >= latest.seq) latest = checkpoint;
  }

  if (latest !== null && latest.seq > table.lastSeq) {
    const from = table.lastSeq + 1;
    const ends = table.lastSeq === 0 ? 'the table is empty' : `the table ends at #${table.lastSeq}`;
    problems.push(
      `The trail was truncated: the signed checkpoint on line ${latest.line} (${latest.at}) records entry #${latest.seq}, but ${ends}; entries #${from} to #${latest.seq} were deleted.`,
    );
    findings.push({
      seq: from,
      reason: `entries #${from} to #${latest.seq} were deleted from the end of the trail (truncated): the signed checkpoint on line ${latest.line} (${latest.at}) records entry #${latest.seq}`,
    });
  }

  let lastMatching = 0;
  let mismatch: { checkpoint: SignedCheckpoint; found: string | null; after: number } | null = null;
  let mismatches = 0;
  for (const checkpoint of [...read.checkpoints].sort((a, b) => a.seq - b.seq)) {
    if (checkpoint.seq === 0 || checkpoint.seq > table.lastSeq) continue;
    const found = table.hashAt(checkpoint.seq);
    if (found === checkpoint.hash) {
      if (mismatch === null) lastMatching = checkpoint.seq;
      continue;
    }
    mismatches += 1;
    mismatch ??= { checkpoint, found, after: lastMatching };
  }
  if (mismatch !== null) {
    const { checkpoint, found, after } = mismatch;
    const signed = `the signed checkpoint on line ${checkpoint.line} (${checkpoint.at})`;
    const what =
      found === null
        ? `entry #${checkpoint.seq}, which ${signed} records, is missing from the table`
        : `entry #${checkpoint.seq} no longer has the hash ${signed} records (${short(checkpoint.hash)}… signed, ${short(found)}… in the table)`;
    const others =
      mismatches > 1 ? ` ${mismatches} checkpoints in all disagree with the table.` : '';
    problems.push(
      `The trail was rewritten: ${what}. Entries between #${after + 1} and #${checkpoint.seq} were changed, removed or inserted and the chain re-hashed after that checkpoint was written.${others}`,
    );
    findings.push({
      seq: after + 1,
      reason: `the chain from here to entry #${checkpoint.seq} was rewritten and re-hashed: ${what}`,
    });
  }

  const shown =
    problems.length > MAX_PROBLEMS
      ? [
          ...problems.slice(0, MAX_PROBLEMS),
          `… and ${problems.length - MAX_PROBLEMS} more problems.`,
        ]
      : problems;
  findings.sort((a, b) => a.seq - b.seq);
  return {
    check: {
      intact: problems.length === 0,
      checkpoints: read.lines,
      latest:
        latest === null
          ? null
          : { line: latest.line, seq: latest.seq, hash: latest.hash, at: latest.at },
      unanchored: latest === null ? table.lastSeq : Math.max(0, table.lastSeq - latest.seq),
      keyFingerprint: read.keyFingerprint,
      problems: shown,
    },
    finding: findings[0] ?? null,
  };
}

function short(hash: string | null): string {
  return (hash ?? '').slice(0, 12);
}
