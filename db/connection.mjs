// A Sequelize connection for the scripts, from the same PW_DB_* variables the server reads.
import { Sequelize } from 'sequelize';

export function connectFromEnv(env = process.env) {
  const password = env.PW_DB_PASSWORD;
  if (!password) throw new Error('PW_DB_PASSWORD is not set (the scripts pass it from .data/db.json)');
  return new Sequelize({
    dialect: 'mariadb',
    host: env.PW_DB_HOST || '127.0.0.1',
    port: Number(env.PW_DB_PORT || 3307),
    database: env.PW_DB_NAME || 'phasewright',
    username: env.PW_DB_USER || 'phasewright',
    password,
    logging: false,
    dialectOptions: { connectTimeout: 3000 },
  });
}
