/**
 * `node backend/dist/demo/create-first-admin.js` — reads `{ "email", "name", "password" }` as
 * JSON on stdin and creates the first admin of an empty installation (DATA_DIR as the server
 * uses it). Prints the outcome as JSON. Exit codes: 0 created, 3 not empty (nothing written),
 * 1 error. Used by the demo seeder (`seed/`); the password never appears on a command line.
 */
import 'reflect-metadata';
import { NestFactory } from '@nestjs/core';
import { DemoModule } from './demo.module';
import { DemoSeedService, FirstAdminInput } from './demo-seed.service';
import { errorMessage } from '../common/errors/error-message';

async function readStdin(): Promise<string> {
  const chunks: Buffer[] = [];
  for await (const chunk of process.stdin) chunks.push(Buffer.from(chunk as Uint8Array));
  return Buffer.concat(chunks).toString('utf8');
}

function parseInput(text: string): FirstAdminInput {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    throw new Error('stdin: text that is not JSON found, { "email", "name", "password" } expected');
  }
  const record =
    typeof value === 'object' && value !== null ? (value as Record<string, unknown>) : {};
  for (const field of ['email', 'name', 'password']) {
    if (typeof record[field] !== 'string' || record[field] === '') {
      throw new Error(`stdin: ${field} missing or empty, a non-empty string expected`);
    }
  }
  return {
    email: String(record.email),
    name: String(record.name),
    password: String(record.password),
  };
}

async function main(): Promise<number> {
  const input = parseInput(await readStdin());
  const context = await NestFactory.createApplicationContext(DemoModule.forRoot(process.env), {
    logger: ['error'],
  });
  try {
    const outcome = await context.get(DemoSeedService).createFirstAdmin(input);
    process.stdout.write(`${JSON.stringify(outcome)}\n`);
    return outcome.created ? 0 : 3;
  } finally {
    await context.close();
  }
}

main().then(
  (code) => process.exit(code),
  (error: unknown) => {
    process.stderr.write(`${errorMessage(error)}\n`);
    process.exit(1);
  },
);
