import { type MigrationInterface, type QueryRunner } from 'typeorm';

// Frozen copies of the signed-order trigger's column lists, as OrderCancellation wrote them: a
// migration never reads the code of today, which may have moved on.
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
  'duplicate_order_reason',
];
/** The reason for ordering on a superseded protocol version is part of what was signed. */
const signedOrderFacts = [...earlierFacts, 'superseded_version_reason'];
const cancellationFacts = ['cancelled_at', 'cancelled_by', 'cancel_reason', 'status'];

const trigger = (
  facts: string[],
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
              END IF;
              IF OLD.cancelled_at IS NOT NULL AND (${changed(cancellationFacts)}) THEN
                ${refuse('A cancelled order stays cancelled, with who cancelled it, when and why.')};
              END IF;
            END`;

/** Hand-written: the signed-order trigger learns the superseded-version reason. */
export class SupersededReasonSigned1796309618215 implements MigrationInterface {
  name = 'SupersededReasonSigned1796309618215';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TRIGGER \`treatment_order_signed_kept\``);
    await queryRunner.query(trigger(signedOrderFacts));
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TRIGGER \`treatment_order_signed_kept\``);
    await queryRunner.query(trigger(earlierFacts));
  }
}
