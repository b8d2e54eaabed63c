import { type MigrationInterface, type QueryRunner } from 'typeorm';

export class ProtocolVersions1796161598177 implements MigrationInterface {
  name = 'ProtocolVersions1796161598177';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE \`protocol_version\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`protocol_key\` varchar(64) NOT NULL, \`version\` int UNSIGNED NOT NULL, \`kind\` varchar(8) NOT NULL, \`title\` varchar(200) NOT NULL, \`status\` enum ('draft', 'approved', 'retired') NOT NULL, \`origin\` enum ('shipped', 'imported', 'cloned') NOT NULL, \`definition\` json NOT NULL, \`sha256\` char(64) NOT NULL, \`source_file\` varchar(200) NULL, \`created_by\` int UNSIGNED NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`approved_at\` datetime(3) NULL, \`retired_at\` datetime(3) NULL, \`retired_by\` int UNSIGNED NULL, UNIQUE INDEX \`uq_protocol_version_key_version\` (\`protocol_key\`, \`version\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`protocol_approval\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`protocol_version_id\` int UNSIGNED NOT NULL, \`user_id\` int UNSIGNED NOT NULL, \`approved_as\` varchar(16) NOT NULL, \`definition_sha256\` char(64) NOT NULL, \`approved_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), UNIQUE INDEX \`uq_protocol_approval_person\` (\`protocol_version_id\`, \`user_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `ALTER TABLE \`protocol_approval\` ADD CONSTRAINT \`FK_e6e477cfa38626feb716bf123bb\` FOREIGN KEY (\`protocol_version_id\`) REFERENCES \`protocol_version\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`protocol_approval\` ADD CONSTRAINT \`FK_fdb7a46cb0e3b3f03679d134df1\` FOREIGN KEY (\`user_id\`) REFERENCES \`user\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    // Hand-written after generation: the database itself keeps approved versions unchanged.
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
    await queryRunner.query(`CREATE TRIGGER \`protocol_version_kept\` BEFORE DELETE ON \`protocol_version\` FOR EACH ROW
            BEGIN
              IF OLD.status <> 'draft' THEN
                SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'An approved or retired protocol version cannot be deleted.';
              END IF;
            END`);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP TRIGGER \`protocol_version_kept\``);
    await queryRunner.query(`DROP TRIGGER \`protocol_version_immutable\``);
    await queryRunner.query(
      `ALTER TABLE \`protocol_approval\` DROP FOREIGN KEY \`FK_fdb7a46cb0e3b3f03679d134df1\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`protocol_approval\` DROP FOREIGN KEY \`FK_e6e477cfa38626feb716bf123bb\``,
    );
    await queryRunner.query(`DROP INDEX \`uq_protocol_approval_person\` ON \`protocol_approval\``);
    await queryRunner.query(`DROP TABLE \`protocol_approval\``);
    await queryRunner.query(
      `DROP INDEX \`uq_protocol_version_key_version\` ON \`protocol_version\``,
    );
    await queryRunner.query(`DROP TABLE \`protocol_version\``);
  }
}
