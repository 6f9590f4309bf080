/**
 * `npm run backup` and `npm run restore` as the commands they are: separate processes on the
 * data folder of a running server, with their arguments, output and exit codes. The entry files
 * run from source (compiled on load with @swc/core, as the worker threads are under jest); the
 * build compiles the same files to dist/backup/. Sources: OWASP ASVS 4.0 V8.1.5 (backups and a
 * tested restore); exit codes and refusals are common practice for command-line tools.
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import request from 'supertest';
import { startTestApp, TestApp } from './helpers/test-app';

const SRC = resolve(__dirname, '..', 'src', 'backup');

interface Run {
  code: number | null;
  stdout: string;
  stderr: string;
}

describe('backup and restore commands', () => {
  let t: TestApp;
  const work = mkdtempSync(join(tmpdir(), 'gyre-backup-cli-'));
  const launcher = join(work, 'launch.js');

  beforeAll(async () => {
    t = await startTestApp();
    // Loads the TypeScript entry file as node would load the built one.
    writeFileSync(
      launcher,
      `const { readFileSync } = require('node:fs');
const swc = require(${JSON.stringify(require.resolve('@swc/core'))});
require.extensions['.ts'] = (module, filename) => {
  const { code } = swc.transformSync(readFileSync(filename, 'utf8'), {
    filename,
    jsc: { parser: { syntax: 'typescript' }, target: 'es2022' },
    module: { type: 'commonjs' },
  });
  module._compile(code, filename);
};
const entry = process.argv.splice(2, 1)[0];
require(entry);
`,
    );
    const response = await request(t.url)
      .post('/api/participants')
      .set(await t.authHeader('technician'))
      .send({ code: 'CLI-0001' });
    expect(response.status).toBe(201);
  });
  afterAll(async () => {
    await t.close();
    rmSync(work, { recursive: true, force: true });
  });

  function run(command: 'backup' | 'restore', args: string[], env: NodeJS.ProcessEnv = {}) {
    return new Promise<Run>((done, fail) => {
      const child = spawn(process.execPath, [launcher, join(SRC, `${command}-cli.ts`), ...args], {
        cwd: work,
        env: { PATH: process.env.PATH, ...env },
        stdio: ['ignore', 'pipe', 'pipe'],
      });
      let stdout = '';
      let stderr = '';
      child.stdout.on('data', (chunk: Buffer) => (stdout += chunk.toString('utf8')));
      child.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString('utf8')));
      child.once('error', fail);
      child.once('close', (code) => done({ code, stdout, stderr }));
    });
  }

  it('backs up a running server, restores into a new folder, and refuses to do it twice', async () => {
    const out = join(work, 'nightly');
    const backup = await run('backup', ['--out', out], { DATA_DIR: t.config.dataDir });
    expect(backup).toMatchObject({ code: 0, stderr: '' });
    expect(backup.stdout).toContain(`Backup of ${t.config.dataDir} written to ${out}`);
    expect(backup.stdout).toMatch(/integrity check ok, audit trail up to #\d+/);
    expect(existsSync(join(out, 'manifest.json'))).toBe(true);

    const again = await run('backup', ['--data-dir', t.config.dataDir, '--out', out]);
    expect(again.code).toBe(3);
    expect(again.stderr).toMatch(/is not empty: a backup goes into a new or empty folder/);

    const target = join(work, 'restored');
    const restore = await run('restore', [out, '--data-dir', target]);
    expect(restore).toMatchObject({ code: 0, stderr: '' });
    expect(restore.stdout).toMatch(/Restored \d+ files \(checksums verified\)/);
    expect(restore.stdout).toMatch(
      /audit trail: intact, \d+ entries checked, \d+ signed checkpoints read/,
    );
    expect(readdirSync(target)).toEqual(
      expect.arrayContaining(['gyre.sqlite', 'audit-anchors.jsonl', 'secrets']),
    );

    const twice = await run('restore', [out, '--data-dir', target]);
    expect(twice.code).toBe(3);
    expect(twice.stderr).toMatch(/is not empty .*restore only into a new or empty folder/);
  });

  it('answers wrong arguments with the usage and exit code 2', async () => {
    const unknown = await run('backup', ['--bogus']);
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toMatch(/Usage: npm run backup/);
    const noTarget = await run('restore', [join(work, 'nightly')]);
    expect(noTarget.code).toBe(2);
    expect(noTarget.stderr).toMatch(/--data-dir missing\nUsage: npm run restore/);
    const notABackup = await run('restore', [work, '--data-dir', join(work, 'x')]);
    expect(notABackup.code).toBe(3);
    expect(notABackup.stderr).toMatch(/has no manifest\.json/);
    expect(existsSync(join(work, 'x'))).toBe(false);
  });

  it('restores a backup whose audit trail does not verify, says so and exits with 4', async () => {
    await t.dataSource.query(`DROP TRIGGER "audit_entry_no_update"`);
    await t.dataSource.query(
      `UPDATE "audit_entry" SET "reason" = 'quietly edited' WHERE "seq" = 1`,
    );
    const out = join(work, 'after-edit');
    expect((await run('backup', ['--data-dir', t.config.dataDir, '--out', out])).code).toBe(0);
    const restore = await run('restore', [out, '--data-dir', join(work, 'edited')]);
    expect(restore.code).toBe(4);
    expect(restore.stdout).toMatch(/audit trail: DOES NOT VERIFY/);
    expect(restore.stderr).toMatch(
      /does not verify .*\n {2}- entry #1: its content does not match its hash: the entry was altered/,
    );
  });
});
