import { type MigrationInterface, type QueryRunner } from 'typeorm';

export class SwellingAcknowledged1796294162239 implements MigrationInterface {
  name = 'SwellingAcknowledged1796294162239';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` ADD \`swelling_acknowledged\` tinyint NOT NULL DEFAULT 0`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `ALTER TABLE \`treatment_order\` DROP COLUMN \`swelling_acknowledged\``,
    );
  }
}
