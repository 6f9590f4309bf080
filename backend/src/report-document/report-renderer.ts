import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { Piscina } from 'piscina';
import { VisitReportModel } from './visit-report-model';

/** The worker file: compiled beside this one in dist/, or the TypeScript entry under jest. */
function workerFile(): string {
  const compiled = join(__dirname, 'render.worker.js');
  if (existsSync(compiled)) return compiled;
  const fromSource = join(__dirname, 'ts-worker.cjs');
  if (existsSync(fromSource)) return fromSource;
  throw new Error(`No report worker found beside ${__dirname} (build the backend first)`);
}

/**
 * Renders reports on one worker thread: a report takes about half a second of CPU (font
 * layout, plots), which must not stall every other request on the event loop.
 */
export class ReportRenderer {
  private readonly pool = new Piscina({
    filename: workerFile(),
    minThreads: 0,
    maxThreads: 1,
    idleTimeout: 30_000,
  });

  async render(model: VisitReportModel): Promise<Buffer> {
    const bytes = (await this.pool.run(model, { name: 'render' })) as Uint8Array;
    return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  }

  async close(): Promise<void> {
    await this.pool.close({ force: true });
  }
}
