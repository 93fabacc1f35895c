/**
 * The one Sequelize instance of a process (web server, worker, CLI or test), on MariaDB.
 * Relative imports only: the worker and the CLI load this outside Vite.
 */
import { Sequelize } from 'sequelize';
import { config } from '../config';

export const sequelize = new Sequelize(config.DB_NAME, config.DB_USER, config.DB_PASS, {
  host: config.DB_HOST,
  port: config.DB_PORT,
  dialect: 'mariadb',
  logging: config.LOG_LEVEL === 'debug' ? console.log : false,
  pool: { max: config.DB_POOL_MAX, min: 0, idle: 10_000, acquire: 30_000 },
  define: { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci', underscored: true },
  dialectOptions: { connectTimeout: 5_000 },
  // DATETIME columns are written and read as UTC.
  timezone: '+00:00'
});
