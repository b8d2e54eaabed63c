import { type MigrationInterface, type QueryRunner } from 'typeorm';

// Frozen copies of the signed-order trigger's column lists, as SignedOrderFactsKept wrote them.
const refuse = (message: string) => `SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = '${message}'`;
const changed = (columns: string[]) =>
  columns.map((c) => `NOT (NEW.\`${c}\` <=> OLD.\`${c}\`)`).join(' OR ');
const earlierFacts = [
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
  'protocol_sha256',
  'weight_change_reason',
  'swelling_acknowledged',
];
/** The duplicate-order reason is part of what was signed. */
const signedOrderFacts = [...earlierFacts, 'duplicate_order_reason'];
const cancellationFacts = ['cancelled_at', 'cancelled_by', 'cancel_reason'];

const trigger = (
  facts: string[],
  withCancellation: boolean,
) => `CREATE TRIGGER \`treatment_order_signed_kept\` BEFORE UPDATE ON \`treatment_order\` FOR EACH ROW
            BEGIN
              IF OLD.signed_at IS NOT NULL AND (${changed(facts)}) THEN
                ${refuse('A signed order cannot be changed; amend it (a new revision).')};
              END IF;
              IF OLD.signed_at IS NOT NULL AND OLD.return_comment IS NOT NULL AND NOT (NEW.return_comment <=> OLD.return_comment) THEN
                ${refuse('The return comment of a signed order is written once.')};
              END IF;
              IF OLD.signed_at IS NOT NULL AND OLD.beyond_use_at IS NOT NULL AND (NEW.beyond_use_at IS NULL OR NEW.beyond_use_at < OLD.beyond_use_at) THEN
                ${refuse('The beyond-use time of a signed order only moves later, with a new preparation.')};
              END IF;${
                withCancellation
                  ? `
              IF OLD.cancelled_at IS NOT NULL AND (${changed([...cancellationFacts, 'status'])}) THEN
                ${refuse('A cancelled order stays cancelled, with who cancelled it, when and why.')};
              END IF;`
                  : ''
              }
            END`;

export class OrderCancellation1796303351497 implements MigrationInterface {
  name = 'OrderCancellation1796303351497';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` ADD \`duplicate_order_reason\` varchar(500) NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` ADD \`cancelled_at\` datetime(3) NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` ADD \`cancelled_by\` int UNSIGNED NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` ADD \`cancel_reason\` varchar(500) NULL`,
    );
    await queryRunner.query(`DROP INDEX \`ix_order_status_created\` ON \`treatment_order\``);
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` CHANGE \`status\` \`status\` enum ('draft', 'signed', 'returned', 'checked', 'prepared', 'ready', 'in-session', 'completed', 'stopped', 'reviewed', 'superseded', 'cancelled') NOT NULL`,
    );
    await queryRunner.query(
      `CREATE INDEX \`ix_order_status_created\` ON \`treatment_order\` (\`status\`, \`created_at\`)`,
    );
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` ADD CONSTRAINT \`FK_f350bbf2e906ec825554e396e20\` FOREIGN KEY (\`cancelled_by\`) REFERENCES \`user\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    // Hand-written: the signed-order trigger learns the duplicate-order reason, and a
    // cancellation (status, who, when, why) is written once. The status move to cancelled
    // itself is allowed: the trigger never guarded the status.
    await queryRunner.query(`DROP TRIGGER \`treatment_order_signed_kept\``);
    await queryRunner.query(trigger(signedOrderFacts, true));
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TRIGGER \`treatment_order_signed_kept\``);
    await queryRunner.query(trigger(earlierFacts, false));
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` DROP FOREIGN KEY \`FK_f350bbf2e906ec825554e396e20\``,
    );
    await queryRunner.query(`DROP INDEX \`ix_order_status_created\` ON \`treatment_order\``);
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` CHANGE \`status\` \`status\` enum ('draft', 'signed', 'returned', 'checked', 'prepared', 'ready', 'in-session', 'completed', 'stopped', 'reviewed', 'superseded') NOT NULL`,
    );
    await queryRunner.query(
      `CREATE INDEX \`ix_order_status_created\` ON \`treatment_order\` (\`status\`, \`created_at\`)`,
    );
    await queryRunner.query(`ALTER TABLE \`treatment_order\` DROP COLUMN \`cancel_reason\``);
    await queryRunner.query(`ALTER TABLE \`treatment_order\` DROP COLUMN \`cancelled_by\``);
    await queryRunner.query(`ALTER TABLE \`treatment_order\` DROP COLUMN \`cancelled_at\``);
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` DROP COLUMN \`duplicate_order_reason\``,
    );
  }
}
