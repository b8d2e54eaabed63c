import { type MigrationInterface, type QueryRunner } from 'typeorm';

const refuse = (message: string) => `SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = '${message}'`;

/** The protocol-version guard as ProtocolVersionGuard left it. */
const earlierGuard = `
              IF OLD.status <> 'draft' AND (NEW.definition <> OLD.definition OR NEW.sha256 <> OLD.sha256
                  OR NEW.protocol_key <> OLD.protocol_key OR NEW.version <> OLD.version) THEN
                ${refuse('An approved protocol version cannot be changed; add a new version.')};
              END IF;
              IF OLD.status <> 'draft' AND NEW.status = 'draft' THEN
                ${refuse('An approved protocol version cannot go back to draft; add a new version.')};
              END IF;
              IF OLD.status = 'retired' AND NEW.status <> 'retired' THEN
                ${refuse('A retired protocol version stays retired.')};
              END IF;`;

export class ProtocolSignaturesDiscardsAndSuperseded1796303358061 implements MigrationInterface {
  name = 'ProtocolSignaturesDiscardsAndSuperseded1796303358061';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`ALTER TABLE \`protocol_approval\` ADD \`meaning\` varchar(32) NULL`);
    await queryRunner.query(
      `ALTER TABLE \`protocol_version\` ADD \`discarded_at\` datetime(3) NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE \`protocol_version\` ADD \`discarded_by\` int UNSIGNED NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE \`protocol_version\` ADD \`discard_reason\` varchar(500) NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` ADD \`superseded_version_reason\` varchar(500) NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE \`protocol_version\` CHANGE \`status\` \`status\` enum ('draft', 'approved', 'retired', 'discarded') NOT NULL`,
    );
    // Hand-written: only a draft is ever discarded, and a discarded draft stays discarded.
    await queryRunner.query(`DROP TRIGGER \`protocol_version_immutable\``);
    await queryRunner.query(`CREATE TRIGGER \`protocol_version_immutable\` BEFORE UPDATE ON \`protocol_version\` FOR EACH ROW
            BEGIN${earlierGuard}
              IF OLD.status IN ('approved', 'retired') AND NEW.status = 'discarded' THEN
                ${refuse('An approved protocol version is never discarded; retire it instead.')};
              END IF;
              IF OLD.status = 'discarded' AND (NEW.status <> 'discarded' OR NEW.definition <> OLD.definition OR NEW.sha256 <> OLD.sha256) THEN
                ${refuse('A discarded protocol draft stays discarded.')};
              END IF;
            END`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TRIGGER \`protocol_version_immutable\``);
    await queryRunner.query(`CREATE TRIGGER \`protocol_version_immutable\` BEFORE UPDATE ON \`protocol_version\` FOR EACH ROW
            BEGIN${earlierGuard}
            END`);
    await queryRunner.query(
      `ALTER TABLE \`protocol_version\` CHANGE \`status\` \`status\` enum ('draft', 'approved', 'retired') NOT NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` DROP COLUMN \`superseded_version_reason\``,
    );
    await queryRunner.query(`ALTER TABLE \`protocol_version\` DROP COLUMN \`discard_reason\``);
    await queryRunner.query(`ALTER TABLE \`protocol_version\` DROP COLUMN \`discarded_by\``);
    await queryRunner.query(`ALTER TABLE \`protocol_version\` DROP COLUMN \`discarded_at\``);
    await queryRunner.query(`ALTER TABLE \`protocol_approval\` DROP COLUMN \`meaning\``);
  }
}
