import { type MigrationInterface, type QueryRunner } from 'typeorm';

// Frozen copies, as the migration that first kept signed orders wrote them.
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
];
/** Columns added since, that are part of what was signed: the version's fingerprint, the weight-change reason, the swelling acknowledgement. */
const signedOrderFacts = [
  ...earlierFacts,
  'protocol_sha256',
  'weight_change_reason',
  'swelling_acknowledged',
];

export class SignedOrderFactsKept1796297991104 implements MigrationInterface {
  name = 'SignedOrderFactsKept1796297991104';

  public async up(queryRunner: QueryRunner): Promise<void> {
    // Hand-written: the signed-order trigger learns the columns added after it, and a
    // re-preparation (a fresh vial after the first passed its beyond-use time) may move the
    // beyond-use time later, never earlier and never away.
    await queryRunner.query(`DROP TRIGGER \`treatment_order_signed_kept\``);
    await queryRunner.query(`CREATE TRIGGER \`treatment_order_signed_kept\` BEFORE UPDATE ON \`treatment_order\` FOR EACH ROW
            BEGIN
              IF OLD.signed_at IS NOT NULL AND (${changed(signedOrderFacts)}) THEN
                ${refuse('A signed order cannot be changed; amend it (a new revision).')};
              END IF;
              IF OLD.signed_at IS NOT NULL AND OLD.return_comment IS NOT NULL AND NOT (NEW.return_comment <=> OLD.return_comment) THEN
                ${refuse('The return comment of a signed order is written once.')};
              END IF;
              IF OLD.signed_at IS NOT NULL AND OLD.beyond_use_at IS NOT NULL AND (NEW.beyond_use_at IS NULL OR NEW.beyond_use_at < OLD.beyond_use_at) THEN
                ${refuse('The beyond-use time of a signed order only moves later, with a new preparation.')};
              END IF;
            END`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TRIGGER \`treatment_order_signed_kept\``);
    await queryRunner.query(`CREATE TRIGGER \`treatment_order_signed_kept\` BEFORE UPDATE ON \`treatment_order\` FOR EACH ROW
            BEGIN
              IF OLD.signed_at IS NOT NULL AND (${changed(earlierFacts)}) THEN
                ${refuse('A signed order cannot be changed; amend it (a new revision).')};
              END IF;
              IF OLD.signed_at IS NOT NULL AND ((OLD.return_comment IS NOT NULL AND NOT (NEW.return_comment <=> OLD.return_comment))
                  OR (OLD.beyond_use_at IS NOT NULL AND NOT (NEW.beyond_use_at <=> OLD.beyond_use_at))) THEN
                ${refuse('The return comment and beyond-use time of a signed order are written once.')};
              END IF;
            END`);
  }
}
