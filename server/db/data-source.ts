import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { loadLocalSecrets } from '../ops/local-secrets';
import { dataSourceOptions } from './options';

/**
 * The one data source the TypeORM CLI uses (migration:generate / migration:run). It connects
 * as the owner user, who may change the schema. Tests and the server build their own from the
 * same options.
 */
const secrets = process.env.DB_OWNER_PASSWORD ? null : loadLocalSecrets();

export default new DataSource(
  dataSourceOptions({
    host: process.env.DB_HOST ?? '127.0.0.1',
    port: Number(process.env.DB_PORT ?? 3307),
    database: process.env.DB_NAME ?? 'luxtempo',
    username: process.env.DB_OWNER_USER ?? 'luxtempo_owner',
    password: process.env.DB_OWNER_PASSWORD ?? secrets!.dbOwnerPassword,
  }),
);
