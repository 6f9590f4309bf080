import { DynamicModule, MiddlewareConsumer, Module, NestModule } from '@nestjs/common';
import { AppConfigModule } from './config/config.module';
import { DatabaseModule } from './database/database.module';
import { HealthModule } from './health/health.module';
import { RequestLoggerMiddleware } from './common/logging/request-logger.middleware';

@Module({})
export class AppModule implements NestModule {
  /** Built at call time so that the environment is validated when the app is created. */
  static forRoot(env: Record<string, unknown> = process.env): DynamicModule {
    return {
      module: AppModule,
      imports: [AppConfigModule.forRoot(env), DatabaseModule, HealthModule],
    };
  }

  configure(consumer: MiddlewareConsumer): void {
    consumer.apply(RequestLoggerMiddleware).forRoutes('*path');
  }
}
