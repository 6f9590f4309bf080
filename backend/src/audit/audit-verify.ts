import { existsSync, statSync } from 'node:fs';
import type { AuditAnchorsCheck, AuditVerifyResult } from '@gyre/shared';
import {
  AnchorFinding,
  compareWithTable,
  ReadAnchors,
  readAnchors,
  TableView,
} from './audit-anchor-check';
import { anchorPaths, readLines } from './audit-anchor-file';
import { readAnchorPublicKey } from './audit-anchor-key';
import { ChainRow, ChainWalk, ChainWalkResult } from './audit-chain-walk';
import { openSqliteFile, SqliteFile } from './sqlite-file';

/** Today's chain checks and the anchor checks, in one answer; the smaller entry number wins. */
export function combineVerify(
  chain: ChainWalkResult,
  anchors: { check: AuditAnchorsCheck; finding: AnchorFinding | null },
): AuditVerifyResult {
  const candidates = [chain.firstBroken, anchors.finding].filter(
    (found): found is AnchorFinding => found !== null,
  );
  const firstBroken = candidates.reduce<AnchorFinding | null>(
    (first, found) => (first === null || found.seq < first.seq ? found : first),
    null,
  );
  return {
    intact: chain.intact && anchors.check.intact,
    checked: chain.checked,
    firstBroken,
    lastHash: chain.lastHash,
    anchors: anchors.check,
  };
}

export function tableViewOf(db: SqliteFile): TableView {
  const last = db.prepare(`SELECT MAX("seq") AS "seq" FROM "audit_entry"`).get() as {
    seq: number | null;
  };
  const at = db.prepare(`SELECT "hash" FROM "audit_entry" WHERE "seq" = ?`);
  return {
    lastSeq: last.seq ?? 0,
    hashAt: (seq) => (at.get(seq) as { hash: string } | undefined)?.hash ?? null,
  };
}

/**
 * Compares inside one read transaction, so every lookup sees the same committed state. Read the
 * anchor file before calling: each line only names entries committed before it was written.
 */
export function compareInSnapshot(
  db: SqliteFile,
  read: ReadAnchors,
): { check: AuditAnchorsCheck; finding: AnchorFinding | null } {
  db.exec('BEGIN');
  try {
    return compareWithTable(read, tableViewOf(db));
  } finally {
    db.exec('COMMIT');
  }
}

export function fileHasContent(file: string): boolean {
  return existsSync(file) && statSync(file).size > 0;
}

/**
 * The whole check on a data folder without a running server (used by `npm run restore`):
 * the chain in sequence order and every signed checkpoint, as `GET /api/audit/verify` does.
 */
export async function verifyDataDir(
  dataDir: string,
  databaseFile: string,
): Promise<AuditVerifyResult> {
  const { anchorFile, keyFile } = anchorPaths(dataDir);
  const read = await readAnchors(readLines(anchorFile), {
    publicKey: readAnchorPublicKey(keyFile),
    fileExists: fileHasContent(anchorFile),
  });
  const db = openSqliteFile(databaseFile, { fileMustExist: true, timeout: 5000 });
  try {
    const walk = new ChainWalk();
    for (const row of db.prepare(`SELECT * FROM "audit_entry" ORDER BY "seq"`).iterate()) {
      if (!walk.push(row as ChainRow)) break;
    }
    return combineVerify(walk.result(), compareInSnapshot(db, read));
  } finally {
    db.close();
  }
}
