import type { DataSourceOptions } from 'typeorm';
import { AuditEvent } from './entities/audit-event';
import { User } from './entities/user';
import { migrations } from './migration-list';

export const entities = [User, AuditEvent];

export interface DatabaseConnection {
  host: string;
  port: number;
  database: string;
  username: string;
  password: string;
}

export function dataSourceOptions(connection: DatabaseConnection): DataSourceOptions {
  return {
    type: 'mariadb',
    ...connection,
    entities,
    migrations,
    migrationsTableName: 'schema_migration',
    synchronize: false,
    timezone: 'Z',
    charset: 'utf8mb4_unicode_ci',
    extra: { connectionLimit: 20 },
    logging: ['error'],
  };
}
