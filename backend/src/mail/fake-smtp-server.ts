import { randomUUID } from 'node:crypto';
import { mkdirSync } from 'node:fs';
import { writeFile } from 'node:fs/promises';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { SMTPServer } from 'smtp-server';

/**
 * Gyre's own local SMTP server for development and tests: listens on 127.0.0.1 on a free port,
 * accepts any sender without authentication, and keeps every message as an `.eml` file.
 */
export class FakeSmtpServer {
  private readonly server: SMTPServer;
  private port: number | null = null;

  constructor(private readonly mailDir: string) {
    // The messages hold live reset and invitation links: the owner's eyes only.
    mkdirSync(mailDir, { recursive: true, mode: 0o700 });
    this.server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS', 'AUTH'],
      logger: false,
      banner: 'Gyre local mail catcher',
      size: 10 * 1024 * 1024,
      onData: (stream, session, callback) => {
        const chunks: Buffer[] = [];
        stream.on('data', (chunk: Buffer) => chunks.push(chunk));
        stream.on('error', callback);
        stream.on('end', () => {
          const name = `${new Date().toISOString().replace(/[:.]/g, '-')}-${randomUUID()}.eml`;
          writeFile(join(this.mailDir, name), Buffer.concat(chunks), { mode: 0o600 }).then(
            () => callback(),
            (error: unknown) => callback(error instanceof Error ? error : new Error(String(error))),
          );
        });
      },
    });
  }

  /** Listens on `port` (default: any free one); a test restarts a stopped server on its old port. */
  async start(port = 0): Promise<number> {
    await new Promise<void>((resolve, reject) => {
      this.server.once('error', reject);
      this.server.listen(port, '127.0.0.1', () => resolve());
    });
    this.port = (this.server.server.address() as AddressInfo).port;
    return this.port;
  }

  get listeningPort(): number | null {
    return this.port;
  }

  async stop(): Promise<void> {
    if (this.port === null) return;
    this.port = null;
    await new Promise<void>((resolve) => this.server.close(() => resolve()));
  }
}
