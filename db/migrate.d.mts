import type { Sequelize } from 'sequelize';
import type { Umzug } from 'umzug';

export declare const migrationsDir: string;
export declare const MIGRATION_TABLE: string;
export interface MigrateOptions {
  log?: (message: string) => void;
}
export declare function createMigrator(sequelize: Sequelize, opts?: MigrateOptions): Umzug<unknown>;
export declare function migrate(sequelize: Sequelize, opts?: MigrateOptions): Promise<string[]>;
