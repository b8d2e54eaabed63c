import { type MigrationInterface, type QueryRunner } from 'typeorm';

export class ProtocolVersionGuard1796293943222 implements MigrationInterface {
  name = 'ProtocolVersionGuard1796293943222';

  public async up(queryRunner: QueryRunner): Promise<void> {
    // Each order keeps the SHA-256 of the exact definition it was planned on; earlier orders
    // take it from their version once.
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` ADD \`protocol_sha256\` char(64) NULL`,
    );
    await queryRunner.query(
      `UPDATE \`treatment_order\` o JOIN \`protocol_version\` v ON v.id = o.protocol_version_id SET o.protocol_sha256 = v.sha256`,
    );
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` MODIFY \`protocol_sha256\` char(64) NOT NULL`,
    );
    // Hand-written: an approved version can no longer be taken back to draft, where its
    // definition could be edited under the orders that point at it.
    await queryRunner.query(`DROP TRIGGER \`protocol_version_immutable\``);
    await queryRunner.query(`CREATE TRIGGER \`protocol_version_immutable\` BEFORE UPDATE ON \`protocol_version\` FOR EACH ROW
            BEGIN
              IF OLD.status <> 'draft' AND (NEW.definition <> OLD.definition OR NEW.sha256 <> OLD.sha256
                  OR NEW.protocol_key <> OLD.protocol_key OR NEW.version <> OLD.version) THEN
                SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'An approved protocol version cannot be changed; add a new version.';
              END IF;
              IF OLD.status <> 'draft' AND NEW.status = 'draft' THEN
                SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'An approved protocol version cannot go back to draft; add a new version.';
              END IF;
              IF OLD.status = 'retired' AND NEW.status <> 'retired' THEN
                SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'A retired protocol version stays retired.';
              END IF;
            END`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TRIGGER \`protocol_version_immutable\``);
    await queryRunner.query(`CREATE TRIGGER \`protocol_version_immutable\` BEFORE UPDATE ON \`protocol_version\` FOR EACH ROW
            BEGIN
              IF OLD.status <> 'draft' AND (NEW.definition <> OLD.definition OR NEW.sha256 <> OLD.sha256
                  OR NEW.protocol_key <> OLD.protocol_key OR NEW.version <> OLD.version) THEN
                SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'An approved protocol version cannot be changed; add a new version.';
              END IF;
              IF OLD.status = 'retired' AND NEW.status <> 'retired' THEN
                SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'A retired protocol version stays retired.';
              END IF;
            END`);
    await queryRunner.query(`ALTER TABLE \`treatment_order\` DROP COLUMN \`protocol_sha256\``);
  }
}
