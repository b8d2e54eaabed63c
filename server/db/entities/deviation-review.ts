import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';
import { reviewClassifications, type ReviewClassification } from '../../../shared/schemas/reviews';

/** One step in a deviation's review: closed with a judgement, reopened, or commented. Append-only. */
@Entity({ name: 'deviation_review' })
@Index('ix_deviation_review_deviation', ['deviationId', 'id'])
export class DeviationReview {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ name: 'deviation_id', type: 'int', unsigned: true })
  deviationId!: number;

  @Column({ name: 'reviewer_id', type: 'int', unsigned: true })
  reviewerId!: number;

  @Column({ type: 'enum', enum: ['closed', 'reopened'] })
  action!: 'closed' | 'reopened';

  @Column({ type: 'enum', enum: reviewClassifications, nullable: true })
  classification!: ReviewClassification | null;

  @Column({ type: 'varchar', length: 2000 })
  comment!: string;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;
}
