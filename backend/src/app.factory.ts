import { INestApplication, LogLevel, ValidationPipe } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import type { Request, Response } from 'express';
import { DocumentBuilder, SwaggerModule } from '@nestjs/swagger';
import compression from 'compression';
import cookieParser from 'cookie-parser';
import helmet from 'helmet';
import { AppModule } from './app.module';
import { AppConfig } from './config/app.config';
import { APP_CONFIG } from './config/config.module';
import { HttpExceptionFilter } from './common/errors/http-exception.filter';
import { validationExceptionFactory } from './common/errors/validation-problems';
import { rejectDeepBodies } from './common/http/json-depth';
import { noStore } from './common/http/no-store';
import { UuidParamsPipe } from './common/http/uuid-params.pipe';
import { restrictUmask } from './config/data-dir-permissions';
import { serveClient } from './client-assets';
import { GYRE_VERSION } from './version';
import { withSharedSchemas } from './openapi/api-responses';

const LEVELS: LogLevel[] = ['fatal', 'error', 'warn', 'log', 'debug', 'verbose'];
const COMPRESSION_THRESHOLD_BYTES = 8 * 1024;

export interface CreateAppOptions {
  /** The environment to validate; defaults to process.env. */
  env?: Record<string, unknown>;
}

/** Builds the configured application (not yet listening); used by main.ts and the tests. */
export async function createApp(options: CreateAppOptions = {}): Promise<NestExpressApplication> {
  const env = options.env ?? process.env;
  // Files the app creates (database, WAL, uploads, mail) are its owner's only.
  restrictUmask();
  const app = await NestFactory.create<NestExpressApplication>(AppModule.forRoot(env), {
    bufferLogs: true,
    logger: LEVELS.slice(0, LEVELS.indexOf(logLevelOf(env)) + 1),
  });
  const config = app.get<AppConfig>(APP_CONFIG);
  // X-Forwarded-For is believed only from the proxies TRUST_PROXY names (default: none).
  app.set('trust proxy', config.trustProxy);
  // No ETag on API answers: they are `no-store` (nothing may keep them to revalidate), and
  // hashing every JSON body cost CPU on each request. The static client keeps its own ETags
  // (express.static, client-assets.ts).
  app.set('etag', false);
  // gzip/br for JSON and the static client alike, so registered before both; results bodies
  // come compressed already (they name their Content-Encoding) and pass through untouched.
  // Under 8 KB a body leaves as it is: compressing a 5 KB list cost about 0.4 ms of CPU, a
  // quarter of the whole request, to save a few kilobytes.
  app.use(compression({ filter: compressible, threshold: COMPRESSION_THRESHOLD_BYTES }));
  app.use('/api', noStore);
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          // antd writes its CSS-in-JS into <style> elements at run time.
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          // The report preview shows the draft PDF (a blob: URL) in a frame with the
          // browser's PDF viewer, which the default frame-src/object-src would block.
          'frame-src': ["'self'", 'blob:'],
          'object-src': ["'self'", 'blob:'],
          'upgrade-insecure-requests': null,
        },
      },
    }),
  );
  // Our own parsers (Nest then skips its defaults), so the depth check runs right after them.
  app.useBodyParser('json');
  app.useBodyParser('urlencoded', { extended: true });
  app.use(rejectDeepBodies);
  // The refresh cookie (auth.controller.ts) is the only cookie Gyre reads; unsigned.
  app.use(cookieParser());
  app.setGlobalPrefix('api');
  app.useGlobalPipes(
    new UuidParamsPipe(),
    new ValidationPipe({
      whitelist: true,
      forbidNonWhitelisted: true,
      transform: true,
      exceptionFactory: validationExceptionFactory,
    }),
  );
  app.useGlobalFilters(new HttpExceptionFilter());
  app.enableShutdownHooks();
  setUpOpenApi(app);
  serveClient(app.getHttpAdapter().getInstance());
  return app;
}

/**
 * The middleware's own choice of compressible types, except Server-Sent Events: an
 * event must leave at once, not wait in a compression buffer.
 */
function compressible(request: Request, response: Response): boolean {
  const type = response.getHeader('Content-Type');
  if (typeof type === 'string' && type.startsWith('text/event-stream')) return false;
  return compression.filter(request, response);
}

function setUpOpenApi(app: INestApplication): void {
  const document = withSharedSchemas(
    SwaggerModule.createDocument(
      app,
      new DocumentBuilder()
        .setTitle('Gyre API')
        .setDescription(
          'Alpha-frequency review for clinical-research EEG studies. Research use only.',
        )
        .setVersion(GYRE_VERSION)
        .addBearerAuth()
        .build(),
    ),
  );
  SwaggerModule.setup('api/docs', app, document, { jsonDocumentUrl: 'api/docs/openapi.json' });
}

function logLevelOf(env: Record<string, unknown>): LogLevel {
  const level = env.LOG_LEVEL;
  if (typeof level === 'string' && (LEVELS as string[]).includes(level)) return level as LogLevel;
  return env.NODE_ENV === 'test' ? 'warn' : 'log';
}
