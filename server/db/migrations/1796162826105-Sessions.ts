import { type MigrationInterface, type QueryRunner } from 'typeorm';

export class Sessions1796162826105 implements MigrationInterface {
  name = 'Sessions1796162826105';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE \`deviation\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`order_id\` int UNSIGNED NOT NULL, \`type\` varchar(40) NOT NULL, \`severity\` enum ('minor', 'major', 'critical') NOT NULL, \`expected\` double NULL, \`actual\` double NULL, \`unit\` varchar(20) NULL, \`message\` varchar(600) NOT NULL, \`detected_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`withdrawn_at\` datetime(3) NULL, INDEX \`ix_deviation_detected\` (\`detected_at\`), UNIQUE INDEX \`uq_deviation_order_type\` (\`order_id\`, \`type\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`dose_record\` (\`order_id\` int UNSIGNED NOT NULL, \`outcome\` varchar(16) NOT NULL, \`started_at\` datetime(3) NULL, \`ended_at\` datetime(3) NULL, \`on_time_s\` double NULL, \`delivered_fluence_j_per_cm2\` double NULL, \`volume_given_ml\` double NULL, \`record\` json NOT NULL, \`updated_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3), PRIMARY KEY (\`order_id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`session_event\` (\`id\` bigint UNSIGNED NOT NULL AUTO_INCREMENT, \`order_id\` int UNSIGNED NOT NULL, \`idempotency_key\` char(36) NOT NULL, \`type\` varchar(32) NOT NULL, \`step_id\` varchar(64) NULL, \`client_time\` datetime(3) NOT NULL, \`server_time\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), \`recorded_by\` int UNSIGNED NOT NULL, \`payload\` json NOT NULL, INDEX \`ix_session_event_order\` (\`order_id\`, \`client_time\`), UNIQUE INDEX \`uq_session_event_key\` (\`idempotency_key\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(`DROP INDEX \`uq_session_event_key\` ON \`session_event\``);
    await queryRunner.query(`DROP INDEX \`ix_session_event_order\` ON \`session_event\``);
    await queryRunner.query(`DROP TABLE \`session_event\``);
    await queryRunner.query(`DROP TABLE \`dose_record\``);
    await queryRunner.query(`DROP INDEX \`uq_deviation_order_type\` ON \`deviation\``);
    await queryRunner.query(`DROP INDEX \`ix_deviation_detected\` ON \`deviation\``);
    await queryRunner.query(`DROP TABLE \`deviation\``);
  }
}
