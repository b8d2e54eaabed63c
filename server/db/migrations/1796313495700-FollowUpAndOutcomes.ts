import { type MigrationInterface, type QueryRunner } from 'typeorm';

export class FollowUpAndOutcomes1796313495700 implements MigrationInterface {
  name = 'FollowUpAndOutcomes1796313495700';

  public async up(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `CREATE TABLE \`complication\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`order_id\` int UNSIGNED NOT NULL, \`follow_up_visit_id\` int UNSIGNED NULL, \`patient_id\` int UNSIGNED NOT NULL, \`eye\` enum ('right', 'left') NOT NULL, \`kind\` varchar(64) NOT NULL, \`kind_label\` varchar(120) NOT NULL, \`severity\` enum ('mild', 'moderate', 'severe') NOT NULL, \`onset_on\` date NOT NULL, \`outcome\` enum ('resolved', 'resolving', 'ongoing', 'resolved-with-sequelae') NOT NULL, \`note\` varchar(1000) NULL, \`recorded_by\` int UNSIGNED NOT NULL, \`recorded_at\` datetime(3) NOT NULL, \`reviewed_by\` int UNSIGNED NULL, \`reviewed_at\` datetime(3) NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`ix_complication_review\` (\`reviewed_at\`, \`recorded_at\`), INDEX \`ix_complication_order\` (\`order_id\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `CREATE TABLE \`follow_up_visit\` (\`id\` int UNSIGNED NOT NULL AUTO_INCREMENT, \`order_id\` int UNSIGNED NOT NULL, \`patient_id\` int UNSIGNED NOT NULL, \`eye\` enum ('right', 'left') NOT NULL, \`kind\` enum ('pdt', 'cxl') NOT NULL, \`plan_protocol_version_id\` int UNSIGNED NOT NULL, \`visit_key\` varchar(64) NOT NULL, \`visit_label\` varchar(120) NOT NULL, \`offset_days\` smallint UNSIGNED NOT NULL, \`due_on\` date NOT NULL, \`window_days\` smallint UNSIGNED NOT NULL, \`seen_on\` date NULL, \`recorded_by\` int UNSIGNED NULL, \`recorded_at\` datetime(3) NULL, \`acuity_notation\` varchar(20) NULL, \`acuity_entry\` varchar(20) NULL, \`acuity_log_mar\` double NULL, \`central_subfield_thickness_um\` smallint UNSIGNED NULL, \`subretinal_fluid\` enum ('present', 'resolved') NULL, \`leakage\` enum ('none', 'present', 'not-done') NULL, \`retreatment_decision\` enum ('retreat', 'observe', 'discharge') NULL, \`kmax_d\` double NULL, \`thinnest_pachymetry_um\` smallint UNSIGNED NULL, \`endothelial_cells_per_mm2\` smallint UNSIGNED NULL, \`haze_grade\` tinyint UNSIGNED NULL, \`note\` varchar(1000) NULL, \`reminder_queued_at\` datetime(3) NULL, \`created_at\` datetime(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3), INDEX \`ix_follow_up_visit_patient\` (\`patient_id\`, \`due_on\`), INDEX \`ix_follow_up_visit_due\` (\`recorded_at\`, \`due_on\`), UNIQUE INDEX \`ux_follow_up_visit_order_key\` (\`order_id\`, \`visit_key\`), PRIMARY KEY (\`id\`)) ENGINE=InnoDB`,
    );
    await queryRunner.query(
      `ALTER TABLE \`attachment\` ADD \`follow_up_visit_id\` int UNSIGNED NULL`,
    );
    await queryRunner.query(
      `ALTER TABLE \`complication\` ADD CONSTRAINT \`FK_9dcc9a26cd299c152c7aa5f49e7\` FOREIGN KEY (\`order_id\`) REFERENCES \`treatment_order\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
    await queryRunner.query(
      `ALTER TABLE \`follow_up_visit\` ADD CONSTRAINT \`FK_617afce668766913619e2fa627f\` FOREIGN KEY (\`order_id\`) REFERENCES \`treatment_order\`(\`id\`) ON DELETE RESTRICT ON UPDATE NO ACTION`,
    );
  }

  public async down(queryRunner: QueryRunner): Promise<void> {
    await queryRunner.query(
      `ALTER TABLE \`follow_up_visit\` DROP FOREIGN KEY \`FK_617afce668766913619e2fa627f\``,
    );
    await queryRunner.query(
      `ALTER TABLE \`complication\` DROP FOREIGN KEY \`FK_9dcc9a26cd299c152c7aa5f49e7\``,
    );
    await queryRunner.query(`ALTER TABLE \`attachment\` DROP COLUMN \`follow_up_visit_id\``);
    await queryRunner.query(`DROP INDEX \`ux_follow_up_visit_order_key\` ON \`follow_up_visit\``);
    await queryRunner.query(`DROP INDEX \`ix_follow_up_visit_due\` ON \`follow_up_visit\``);
    await queryRunner.query(`DROP INDEX \`ix_follow_up_visit_patient\` ON \`follow_up_visit\``);
    await queryRunner.query(`DROP TABLE \`follow_up_visit\``);
    await queryRunner.query(`DROP INDEX \`ix_complication_order\` ON \`complication\``);
    await queryRunner.query(`DROP INDEX \`ix_complication_review\` ON \`complication\``);
    await queryRunner.query(`DROP TABLE \`complication\``);
  }
}
