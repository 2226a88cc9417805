import type { SequelizeModuleOptions } from '@nestjs/sequelize';
import type { DatabaseConfig } from '../config/app-config.js';
import { MODELS } from './models.js';

/**
 * Sequelize settings for the app. The server must boot while the database is down (GET /api/health
 * then reports it down), so nothing connects at boot: `autoLoadModels` stays off (it would call
 * authenticate()), models are listed explicitly in MODELS, retries are off and connects time out fast.
 * The schema comes only from migrations (db/migrations, applied by the start and test scripts):
 * `synchronize` is off.
 */
export function sequelizeOptions(db: DatabaseConfig): SequelizeModuleOptions {
  return {
    dialect: 'mariadb',
    host: db.host,
    port: db.port,
    database: db.name,
    username: db.user,
    password: db.password,
    models: [...MODELS],
    autoLoadModels: false,
    synchronize: false,
    retryAttempts: 0,
    logging: false,
    dialectOptions: { connectTimeout: db.connectTimeoutMs },
    pool: { max: 10, min: 0, acquire: db.connectTimeoutMs + 1000, idle: 10_000 },
    define: { underscored: true },
  };
}
