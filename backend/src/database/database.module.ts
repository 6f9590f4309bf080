import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import { sqliteOptions } from './database-options';

@Module({
  imports: [
    TypeOrmModule.forRootAsync({
      inject: [APP_CONFIG],
      useFactory: (config: AppConfig) => sqliteOptions(config.databaseFile),
    }),
  ],
})
export class DatabaseModule {}
