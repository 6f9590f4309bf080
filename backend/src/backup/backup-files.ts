import { createHash } from 'node:crypto';
import { chmod, lstat, mkdir, open, readdir } from 'node:fs/promises';
import { dirname, join, posix, relative, sep } from 'node:path';

/** Backups hold secrets and study data: owner-only folders and files (OWASP ASVS 4.0 V8.1.6). */
export const DIR_MODE = 0o700;
export const FILE_MODE = 0o600;

/** Creates a folder (and its missing parents inside `root`) owner-only. */
export async function ownerOnlyDir(path: string): Promise<void> {
  await mkdir(path, { recursive: true, mode: DIR_MODE });
  await chmod(path, DIR_MODE);
}

/**
 * Copies one file, hashing the bytes as they pass, and flushes it to disk. The target must not
 * exist (`wx`). `limit` stops at that many bytes (a file another process is still appending to).
 */
export async function copyHashed(
  source: string,
  target: string,
  limit: number = Number.POSITIVE_INFINITY,
): Promise<{ bytes: number; sha256: string }> {
  await ownerOnlyDir(dirname(target));
  const hash = createHash('sha256');
  const input = await open(source, 'r');
  try {
    const output = await open(target, 'wx', FILE_MODE);
    try {
      const buffer = Buffer.alloc(1024 * 1024);
      let bytes = 0;
      while (bytes < limit) {
        const want = Math.min(buffer.length, limit - bytes);
        const { bytesRead } = await input.read(buffer, 0, want, null);
        if (bytesRead === 0) break;
        const chunk = buffer.subarray(0, bytesRead);
        hash.update(chunk);
        await output.write(chunk);
        bytes += bytesRead;
      }
      await output.sync();
      await output.chmod(FILE_MODE);
      return { bytes, sha256: hash.digest('hex') };
    } finally {
      await output.close();
    }
  } finally {
    await input.close();
  }
}

/** SHA-256 and size of a file as it is on disk. */
export async function hashFile(path: string): Promise<{ bytes: number; sha256: string }> {
  const hash = createHash('sha256');
  const input = await open(path, 'r');
  try {
    const buffer = Buffer.alloc(1024 * 1024);
    let bytes = 0;
    for (;;) {
      const { bytesRead } = await input.read(buffer, 0, buffer.length, null);
      if (bytesRead === 0) break;
      hash.update(buffer.subarray(0, bytesRead));
      bytes += bytesRead;
    }
    return { bytes, sha256: hash.digest('hex') };
  } finally {
    await input.close();
  }
}

export interface TreeEntry {
  /** Relative path with `/` separators. */
  path: string;
  kind: 'file' | 'dir' | 'other';
}

/** Every entry under `root`, depth first, without following symbolic links. */
export async function* walkTree(root: string, under = ''): AsyncGenerator<TreeEntry> {
  const folder = under === '' ? root : join(root, ...under.split('/'));
  const names = (await readdir(folder)).sort();
  for (const name of names) {
    const path = under === '' ? name : `${under}/${name}`;
    const stats = await lstat(join(folder, name));
    if (stats.isDirectory()) {
      yield { path, kind: 'dir' };
      yield* walkTree(root, path);
    } else {
      yield { path, kind: stats.isFile() ? 'file' : 'other' };
    }
  }
}

/** `a/b` for a path inside `root`; null when it lies outside. */
export function relativeInside(root: string, path: string): string | null {
  const rel = relative(root, path);
  if (rel === '' || rel.startsWith('..') || rel.startsWith(sep) || /^[A-Za-z]:/.test(rel)) {
    return rel === '' ? '' : null;
  }
  return rel.split(sep).join(posix.sep);
}

/**
 * A manifest path that stays inside the folder it names files of: relative, `/`-separated, no
 * empty, `.` or `..` segment (OWASP ASVS 4.0 V12.3.1, path traversal).
 */
export function isSafeRelativePath(path: string): boolean {
  if (path === '' || path.startsWith('/') || path.includes('\\') || path.includes('\0')) {
    return false;
  }
  return path.split('/').every((segment) => segment !== '' && segment !== '.' && segment !== '..');
}
