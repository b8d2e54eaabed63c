import { createHash } from 'node:crypto';
import { type MigrationInterface, type QueryRunner } from 'typeorm';

// Frozen copy of server/audit/chain.ts as it stood when this migration landed: a migration must
// hash old rows the same way whatever the app's code becomes later.
function auditRowHash(
  prevHash: string,
  row: {
    occurredAt: Date;
    actorUserId: number | null;
    action: string;
    entityType: string | null;
    entityId: string | null;
    ipAddress: string | null;
    details: string | null;
  },
): string {
  const canonical = JSON.stringify([
    'luxtempo-audit-v1',
    prevHash,
    row.occurredAt.toISOString(),
    row.actorUserId,
    row.action,
    row.entityType,
    row.entityId,
    row.ipAddress,
    row.details,
  ]);
  return createHash('sha256').update(canonical, 'utf8').digest('hex');
}

const refuse = (message: string) => `SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = '${message}'`;
const changed = (columns: string[]) =>
  columns.map((c) => `NOT (NEW.\`${c}\` <=> OLD.\`${c}\`)`).join(' OR ');

/** What a signed order states; only its status (and the write-once return comment and beyond-use time) may move. */
const signedOrderFacts = [
  'patient_id',
  'eye',
  'protocol_version_id',
  'revision',
  'previous_revision_id',
  'amendment_reason',
  'inputs',
  'plan',
  'engine_version',
  'checklist',
  'soft_limit_reasons',
  'retreatment_reason',
  'note',
  'created_by',
  'signed_by',
  'signed_at',
  'signature_meaning',
];
const doseRecordFacts = [
  'order_id',
  'outcome',
  'started_at',
  'ended_at',
  'on_time_s',
  'delivered_fluence_j_per_cm2',
  'volume_given_ml',
  'record',
  'protocol_version_id',
  'local_month',
  'eye',
  'patient_id',
  'planned_dose_mg',
  'planned_fluence_j_per_cm2',
  'deviation_count',
];
const deviationFacts = [
  'order_id',
  'type',
  'severity',
  'expected',
  'actual',
  'unit',
  'message',
  'detected_at',
  'withdrawn_at',
  'protocol_version_id',
];
/** Session events are accepted up to 12 h after a session's end (server/sessions/service.ts); one hour more for clocks that differ. */
const closedAfter = 'INTERVAL 13 HOUR';

export class DatabaseIntegrity1796200000000 implements MigrationInterface {
  name = 'DatabaseIntegrity1796200000000';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE \`audit_chain_head\` (\`id\` tinyint UNSIGNED NOT NULL, \`last_event_id\` bigint UNSIGNED NULL, \`last_hash\` char(64) NOT NULL, PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `ALTER TABLE \`audit_event\` ADD \`prev_hash\` char(64) NOT NULL DEFAULT ''`,
    );
    await queryRunner.query(
      `ALTER TABLE \`audit_event\` ADD \`hash\` char(64) NOT NULL DEFAULT ''`,
    );

    // Hand-written: chain the rows that exist, oldest first, in batches.
    let prevHash = '0'.repeat(64);
    let lastId: string | null = null;
    for (;;) {
      const rows: {
        id: string;
        occurredAt: Date;
        actorUserId: number | null;
        action: string;
        entityType: string | null;
        entityId: string | null;
        ipAddress: string | null;
        details: string | null;
      }[] = await queryRunner.query(
        `SELECT id, occurred_at AS occurredAt, actor_user_id AS actorUserId, action, entity_type AS entityType, entity_id AS entityId, ip_address AS ipAddress, details
                   FROM \`audit_event\` WHERE id > ? ORDER BY id LIMIT 1000`,
        [lastId ?? 0],
      );
      if (rows.length === 0) break;
      const cases: { id: string; prev: string; hash: string }[] = [];
      for (const row of rows) {
        const details =
          row.details == null
            ? null
            : typeof row.details === 'string'
              ? row.details
              : JSON.stringify(row.details);
        const hash = auditRowHash(prevHash, {
          ...row,
          actorUserId: row.actorUserId == null ? null : Number(row.actorUserId),
          details,
        });
        cases.push({ id: String(row.id), prev: prevHash, hash });
        prevHash = hash;
        lastId = String(row.id);
      }
      const ids = cases.map((c) => c.id);
      await queryRunner.query(
        `UPDATE \`audit_event\` SET prev_hash = CASE id ${cases.map(() => 'WHEN ? THEN ?').join(' ')} END, hash = CASE id ${cases.map(() => 'WHEN ? THEN ?').join(' ')} END WHERE id IN (${ids.map(() => '?').join(', ')})`,
        [...cases.flatMap((c) => [c.id, c.prev]), ...cases.flatMap((c) => [c.id, c.hash]), ...ids],
      );
    }
    await queryRunner.query(
      `INSERT INTO \`audit_chain_head\` (id, last_event_id, last_hash) VALUES (1, ?, ?)`,
      [lastId, prevHash],
    );
    await queryRunner.query(`ALTER TABLE \`audit_event\` ALTER \`prev_hash\` DROP DEFAULT`);
    await queryRunner.query(`ALTER TABLE \`audit_event\` ALTER \`hash\` DROP DEFAULT`);

    // Hand-written: what was signed or recorded stays as it was, whoever connects.
    await queryRunner.query(`CREATE TRIGGER \`audit_chain_head_kept\` BEFORE DELETE ON \`audit_chain_head\` FOR EACH ROW
            BEGIN ${refuse('The audit chain head cannot be deleted.')}; END`);
    await queryRunner.query(`CREATE TRIGGER \`treatment_order_signed_kept\` BEFORE UPDATE ON \`treatment_order\` FOR EACH ROW
            BEGIN
              IF OLD.signed_at IS NOT NULL AND (${changed(signedOrderFacts)}) THEN
                ${refuse('A signed order cannot be changed; amend it (a new revision).')};
              END IF;
              IF OLD.signed_at IS NOT NULL AND ((OLD.return_comment IS NOT NULL AND NOT (NEW.return_comment <=> OLD.return_comment))
                  OR (OLD.beyond_use_at IS NOT NULL AND NOT (NEW.beyond_use_at <=> OLD.beyond_use_at))) THEN
                ${refuse('The return comment and beyond-use time of a signed order are written once.')};
              END IF;
            END`);
    await queryRunner.query(`CREATE TRIGGER \`treatment_order_signed_not_deleted\` BEFORE DELETE ON \`treatment_order\` FOR EACH ROW
            BEGIN
              IF OLD.signed_at IS NOT NULL THEN ${refuse('A signed order cannot be deleted.')}; END IF;
            END`);
    await queryRunner.query(`CREATE TRIGGER \`dose_record_closed\` BEFORE UPDATE ON \`dose_record\` FOR EACH ROW
            BEGIN
              IF OLD.ended_at IS NOT NULL AND OLD.ended_at < UTC_TIMESTAMP(3) - ${closedAfter} AND (${changed(doseRecordFacts)}) THEN
                ${refuse('The dose record of a session that ended more than 12 hours ago cannot be changed.')};
              END IF;
            END`);
    await queryRunner.query(`CREATE TRIGGER \`dose_record_not_deleted\` BEFORE DELETE ON \`dose_record\` FOR EACH ROW
            BEGIN ${refuse('A dose record cannot be deleted.')}; END`);
    await queryRunner.query(`CREATE TRIGGER \`deviation_facts_closed\` BEFORE UPDATE ON \`deviation\` FOR EACH ROW
            BEGIN
              IF (${changed(deviationFacts)}) AND EXISTS (SELECT 1 FROM \`dose_record\` r WHERE r.order_id = OLD.order_id AND r.ended_at IS NOT NULL AND r.ended_at < UTC_TIMESTAMP(3) - ${closedAfter}) THEN
                ${refuse('The facts of a deviation of a session that ended more than 12 hours ago cannot be changed; review it instead.')};
              END IF;
            END`);
    await queryRunner.query(`CREATE TRIGGER \`deviation_not_deleted\` BEFORE DELETE ON \`deviation\` FOR EACH ROW
            BEGIN ${refuse('A deviation cannot be deleted; a deviation that no longer holds is withdrawn.')}; END`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    for (const trigger of [
      'deviation_not_deleted',
      'deviation_facts_closed',
      'dose_record_not_deleted',
      'dose_record_closed',
      'treatment_order_signed_not_deleted',
      'treatment_order_signed_kept',
      'audit_chain_head_kept',
    ]) {
      await queryRunner.query(`DROP TRIGGER \`${trigger}\``);
    }
    await queryRunner.query(`ALTER TABLE \`audit_event\` DROP COLUMN \`hash\``);
    await queryRunner.query(`ALTER TABLE \`audit_event\` DROP COLUMN \`prev_hash\``);
    await queryRunner.query(`DROP TABLE \`audit_chain_head\``);
  }
}
