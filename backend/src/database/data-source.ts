import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { buildAppConfig } from '../config/app.config';
import { validateEnvironment } from '../config/environment';
import { sqliteOptions } from './database-options';

/** For the TypeORM CLI (`npm run migration:generate -w backend -- src/database/migrations/Name`). */
export default new DataSource(
  sqliteOptions(buildAppConfig(validateEnvironment(process.env)).databaseFile),
);
