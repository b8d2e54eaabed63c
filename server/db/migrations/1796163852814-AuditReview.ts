import { type MigrationInterface, type QueryRunner } from 'typeorm';

export class AuditReview1796163852814 implements MigrationInterface {
  name = 'AuditReview1796163852814';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX \`ix_deviation_detected\` ON \`deviation\``);
    await queryRunner.query(
      `CREATE TABLE \`deviation_review\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`deviation_id\` int UNSIGNED NOT NULL, \`reviewer_id\` int UNSIGNED NOT NULL, \`action\` enum ('closed', 'reopened') NOT NULL, \`classification\` enum ('acceptable', 'needs-follow-up', 'incident') NULL, \`comment\` varchar(2000) NOT NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`ix_deviation_review_deviation\` (\`deviation_id\`, \`id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`session_participant\` (\`order_id\` int UNSIGNED NOT NULL, \`user_id\` int UNSIGNED NOT NULL, \`part\` varchar(16) NOT NULL, INDEX \`ix_session_participant_user\` (\`user_id\`, \`order_id\`), PRIMARY KEY (\`order_id\`, \`user_id\`, \`part\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `ALTER TABLE \`deviation\` ADD \`protocol_version_id\` int UNSIGNED NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE \`deviation\` ADD \`review_status\` enum ('open', 'closed') NOT NULL DEFAULT 'open'`,
    );
    await queryRunner.query(
      `ALTER TABLE \`deviation\` ADD \`classification\` enum ('acceptable', 'needs-follow-up', 'incident') NULL`,
    );
    await queryRunner.query(`ALTER TABLE \`deviation\` ADD \`reviewed_by\` int UNSIGNED NULL`);
    await queryRunner.query(`ALTER TABLE \`deviation\` ADD \`reviewed_at\` datetime(3) NULL`);
    await queryRunner.query(
      `ALTER TABLE \`dose_record\` ADD \`protocol_version_id\` int UNSIGNED NULL`,
    );
    await queryRunner.query(`ALTER TABLE \`dose_record\` ADD \`local_month\` char(7) NULL`);
    await queryRunner.query(
      `ALTER TABLE \`dose_record\` ADD \`deviation_count\` smallint UNSIGNED NOT NULL DEFAULT '0'`,
    );
    // Hand-written after generation: fill the new columns for rows that already exist.
    await queryRunner.query(
      `UPDATE \`deviation\` d JOIN \`treatment_order\` o ON o.id = d.order_id SET d.protocol_version_id = o.protocol_version_id`,
    );
    await queryRunner.query(
      `UPDATE \`dose_record\` r JOIN \`treatment_order\` o ON o.id = r.order_id SET r.protocol_version_id = o.protocol_version_id`,
    );
    // Month by UTC for old rows (new rows use the unit's zone); only sessions within hours of midnight at a month's end can differ.
    await queryRunner.query(
      `UPDATE \`dose_record\` SET local_month = DATE_FORMAT(ended_at, '%Y-%m') WHERE ended_at IS NOT NULL`,
    );
    await queryRunner.query(
      `UPDATE \`dose_record\` r SET r.deviation_count = (SELECT COUNT(*) FROM \`deviation\` d WHERE d.order_id = r.order_id AND d.withdrawn_at IS NULL)`,
    );
    await queryRunner.query(
      `INSERT IGNORE INTO \`session_participant\` (order_id, user_id, part) SELECT id, signed_by, 'ordered' FROM \`treatment_order\` WHERE signed_by IS NOT NULL`,
    );
    await queryRunner.query(
      `INSERT IGNORE INTO \`session_participant\` (order_id, user_id, part) SELECT order_id, pharmacist_id, 'checked' FROM \`dose_check\` WHERE outcome = 'match'`,
    );
    await queryRunner.query(
      `INSERT IGNORE INTO \`session_participant\` (order_id, user_id, part) SELECT order_id, pharmacist_id, 'prepared' FROM \`preparation\``,
    );
    await queryRunner.query(
      `INSERT IGNORE INTO \`session_participant\` (order_id, user_id, part) SELECT DISTINCT order_id, recorded_by, 'nursed' FROM \`session_event\``,
    );
    await queryRunner.query(
      `CREATE INDEX \`ix_deviation_severity_detected\` ON \`deviation\` (\`severity\`, \`withdrawn_at\`, \`detected_at\`)`,
    );
    await queryRunner.query(
      `CREATE INDEX \`ix_deviation_type_detected\` ON \`deviation\` (\`type\`, \`withdrawn_at\`, \`detected_at\`)`,
    );
    await queryRunner.query(
      `CREATE INDEX \`ix_deviation_protocol_detected\` ON \`deviation\` (\`protocol_version_id\`, \`withdrawn_at\`, \`detected_at\`)`,
    );
    await queryRunner.query(
      `CREATE INDEX \`ix_deviation_review_detected\` ON \`deviation\` (\`review_status\`, \`withdrawn_at\`, \`detected_at\`)`,
    );
    await queryRunner.query(
      `CREATE INDEX \`ix_deviation_detected\` ON \`deviation\` (\`withdrawn_at\`, \`detected_at\`)`,
    );
    await queryRunner.query(
      `CREATE INDEX \`ix_dose_record_month\` ON \`dose_record\` (\`local_month\`, \`protocol_version_id\`)`,
    );
    await queryRunner.query(
      `CREATE INDEX \`ix_dose_record_protocol_ended\` ON \`dose_record\` (\`protocol_version_id\`, \`ended_at\`)`,
    );
    await queryRunner.query(
      `CREATE INDEX \`ix_dose_record_ended\` ON \`dose_record\` (\`ended_at\`)`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX \`ix_dose_record_ended\` ON \`dose_record\``);
    await queryRunner.query(`DROP INDEX \`ix_dose_record_protocol_ended\` ON \`dose_record\``);
    await queryRunner.query(`DROP INDEX \`ix_dose_record_month\` ON \`dose_record\``);
    await queryRunner.query(`DROP INDEX \`ix_deviation_detected\` ON \`deviation\``);
    await queryRunner.query(`DROP INDEX \`ix_deviation_review_detected\` ON \`deviation\``);
    await queryRunner.query(`DROP INDEX \`ix_deviation_protocol_detected\` ON \`deviation\``);
    await queryRunner.query(`DROP INDEX \`ix_deviation_type_detected\` ON \`deviation\``);
    await queryRunner.query(`DROP INDEX \`ix_deviation_severity_detected\` ON \`deviation\``);
    await queryRunner.query(`ALTER TABLE \`dose_record\` DROP COLUMN \`deviation_count\``);
    await queryRunner.query(`ALTER TABLE \`dose_record\` DROP COLUMN \`local_month\``);
    await queryRunner.query(`ALTER TABLE \`dose_record\` DROP COLUMN \`protocol_version_id\``);
    await queryRunner.query(`ALTER TABLE \`deviation\` DROP COLUMN \`reviewed_at\``);
    await queryRunner.query(`ALTER TABLE \`deviation\` DROP COLUMN \`reviewed_by\``);
    await queryRunner.query(`ALTER TABLE \`deviation\` DROP COLUMN \`classification\``);
    await queryRunner.query(`ALTER TABLE \`deviation\` DROP COLUMN \`review_status\``);
    await queryRunner.query(`ALTER TABLE \`deviation\` DROP COLUMN \`protocol_version_id\``);
    await queryRunner.query(
      `DROP INDEX \`ix_session_participant_user\` ON \`session_participant\``,
    );
    await queryRunner.query(`DROP TABLE \`session_participant\``);
    await queryRunner.query(`DROP INDEX \`ix_deviation_review_deviation\` ON \`deviation_review\``);
    await queryRunner.query(`DROP TABLE \`deviation_review\``);
    await queryRunner.query(
      `CREATE INDEX \`ix_deviation_detected\` ON \`deviation\` (\`detected_at\`)`,
    );
  }
}
