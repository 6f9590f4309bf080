import { Injectable, Logger, NestMiddleware } from '@nestjs/common';
import type { NextFunction, Request, Response } from 'express';

/** One line per API request: method, path (no query string, no body), status, duration. */
@Injectable()
export class RequestLoggerMiddleware implements NestMiddleware {
  private readonly logger = new Logger('HTTP');

  use(request: Request, response: Response, next: NextFunction): void {
    const startedAt = process.hrtime.bigint();
    const path = request.originalUrl.split('?')[0];
    response.on('finish', () => {
      const ms = Number(process.hrtime.bigint() - startedAt) / 1e6;
      this.logger.log(`${request.method} ${path} ${response.statusCode} ${ms.toFixed(1)} ms`);
    });
    next();
  }
}
