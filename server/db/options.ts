import { DataSource, type DataSourceOptions } from 'typeorm';
import type { Config } from '../config';
import { Attachment } from './entities/attachment';
import { AuditChainHead } from './entities/audit-chain-head';
import { AuditEvent } from './entities/audit-event';
import { Device, DeviceVersion, Lens, OutputCheck } from './entities/device';
import { DeviationRow } from './entities/deviation';
import { DeviationReview } from './entities/deviation-review';
import { DoseCheck } from './entities/dose-check';
import { DoseRecordRow } from './entities/dose-record';
import { FhirDelivery } from './entities/fhir-delivery';
import { Complication } from './entities/complication';
import { FollowUpVisit } from './entities/follow-up-visit';
import { OutboxMessage } from './entities/outbox-message';
import { PasswordLink } from './entities/password-link';
import { Patient } from './entities/patient';
import { PatientMeasurement } from './entities/patient-measurement';
import { Preparation } from './entities/preparation';
import { ProtocolApproval } from './entities/protocol-approval';
import { ProtocolVersion } from './entities/protocol-version';
import { RoleRequest } from './entities/role-request';
import { SessionEventRow } from './entities/session-event';
import { SessionParticipant } from './entities/session-participant';
import { SignInSession } from './entities/sign-in-session';
import { SignInThrottle } from './entities/sign-in-throttle';
import { TreatmentOrder } from './entities/treatment-order';
import { User } from './entities/user';
import { ListBookingRow } from './entities/list-booking';
import { PreparationStockRow } from './entities/preparation-stock';
import { StockLotRow } from './entities/stock-lot';
import { StockMovementRow } from './entities/stock-movement';
import { TreatmentListRow } from './entities/treatment-list';
import { migrations } from './migration-list';

export const entities = [
  User,
  AuditEvent,
  ProtocolVersion,
  ProtocolApproval,
  Patient,
  TreatmentOrder,
  DoseCheck,
  Preparation,
  Attachment,
  OutboxMessage,
  SessionEventRow,
  DeviationRow,
  DoseRecordRow,
  DeviationReview,
  FollowUpVisit,
  Complication,
  SessionParticipant,
  PatientMeasurement,
  SignInSession,
  PasswordLink,
  SignInThrottle,
  RoleRequest,
  AuditChainHead,
  FhirDelivery,
  Device,
  DeviceVersion,
  Lens,
  OutputCheck,
  TreatmentListRow,
  ListBookingRow,
  StockLotRow,
  StockMovementRow,
  PreparationStockRow,
];

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
    // Calendar dates (birth, expiry) stay strings: no time zone may shift them.
    dateStrings: ['DATE'],
    charset: 'utf8mb4_unicode_ci',
    // trace: false: mysql2 would otherwise capture a stack trace for every statement (about 6 % of
    // the API's CPU on a tap, README "Taps at a ward's pace") only to print it if the statement
    // fails; TypeORM's QueryFailedError keeps its own stack, with the awaiting callers.
    extra: { connectionLimit: 20, trace: false },
    // Failures reach the error handler, which logs what is unexpected; expected ones (a replayed
    // idempotency key, a refused trigger) are not noise worth printing.
    logging: false,
  };
}

/** The running app's connection: the app user, with table rights only. */
export function appDataSource(config: Config): DataSource {
  return new DataSource(
    dataSourceOptions({
      host: config.DB_HOST,
      port: config.DB_PORT,
      database: config.DB_NAME,
      username: config.DB_USER,
      password: config.DB_PASSWORD,
    }),
  );
}

/**
 * The schema owner's sign-in. Only the migration step holds it (server/ops/migrate-step.ts);
 * the web server's configuration has no field for it.
 */
export interface OwnerCredentials {
  user: string;
  password: string;
}

/** The schema owner's connection, for migrations. */
export function ownerDataSource(
  config: Config,
  owner: OwnerCredentials,
  extra: { migrationsTransactionMode?: 'all' | 'none' | 'each'; logging?: boolean } = {},
): DataSource {
  return new DataSource({
    ...dataSourceOptions({
      host: config.DB_HOST,
      port: config.DB_PORT,
      database: config.DB_NAME,
      username: owner.user,
      password: owner.password,
    }),
    ...extra,
  } as DataSourceOptions);
}
