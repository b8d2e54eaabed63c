import { type MigrationInterface, type QueryRunner } from 'typeorm';

/**
 * A drug past its beyond-use time is made up again: an order may now have several preparations,
 * the latest counting. The new index comes first, because the foreign key on order_id needs one.
 */
export class PreparationHistory1796294636289 implements MigrationInterface {
  name = 'PreparationHistory1796294636289';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE INDEX \`ix_preparation_order\` ON \`preparation\` (\`order_id\`, \`id\`)`,
    );
    await queryRunner.query(`DROP INDEX \`uq_preparation_order\` ON \`preparation\``);
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE UNIQUE INDEX \`uq_preparation_order\` ON \`preparation\` (\`order_id\`)`,
    );
    await queryRunner.query(`DROP INDEX \`ix_preparation_order\` ON \`preparation\``);
  }
}
