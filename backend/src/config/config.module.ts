import { DynamicModule, Global, Module } from '@nestjs/common';
import { ConfigModule } from '@nestjs/config';
import { AppConfig, buildAppConfig } from './app.config';
import { validateEnvironment } from './environment';

export const APP_CONFIG = Symbol('APP_CONFIG');

/**
 * Validates the environment once, when the application module is built, and provides the
 * typed configuration under {@link APP_CONFIG}.
 */
@Global()
@Module({})
export class AppConfigModule {
  static forRoot(env: Record<string, unknown> = process.env): DynamicModule {
    const config: AppConfig = buildAppConfig(validateEnvironment(env));
    return {
      module: AppConfigModule,
      imports: [
        ConfigModule.forRoot({
          isGlobal: true,
          ignoreEnvFile: true,
          ignoreEnvVars: true,
          load: [() => ({ app: config })],
        }),
      ],
      providers: [{ provide: APP_CONFIG, useValue: config }],
      exports: [APP_CONFIG],
    };
  }
}
