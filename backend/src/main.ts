import 'reflect-metadata';
import { Logger } from '@nestjs/common';
import { createApp } from './app.factory';
import { AppConfig } from './config/app.config';
import { APP_CONFIG } from './config/config.module';
import { restrictUmask } from './config/data-dir-permissions';
import { EnvironmentError } from './config/environment';

async function bootstrap(): Promise<void> {
  // First of all: nothing Gyre writes may be readable by other local users.
  restrictUmask();
  const app = await createApp();
  const config = app.get<AppConfig>(APP_CONFIG);
  await app.listen(config.port, config.host);
  const url = `http://localhost:${config.port}`;
  Logger.log(`Gyre is running at ${url} (API ${url}/api, data in ${config.dataDir})`, 'Gyre');
  if (config.jwtSecretSource === 'generated') {
    Logger.log(`Generated a sign-in secret in ${config.dataDir}/secrets/jwt-secret`, 'Gyre');
  }
}

bootstrap().catch((error: unknown) => {
  if (error instanceof EnvironmentError) {
    process.stderr.write(`${error.message}\n`);
  } else {
    process.stderr.write(
      `Gyre failed to start: ${error instanceof Error ? error.stack : String(error)}\n`,
    );
  }
  process.exit(1);
});
