import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import { TreatmentOrder } from './treatment-order';

/** A measurement report attached to an order; the bytes live under the upload folder. */
@Entity({ name: 'attachment' })
@Index('ix_attachment_order', ['orderId'])
export class Attachment {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ name: 'order_id', type: 'int', unsigned: true })
  orderId!: number;

  @ManyToOne(() => TreatmentOrder, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'order_id' })
  order!: Relation<TreatmentOrder>;

  /** Set when the report belongs to a follow-up visit of the order rather than to the order itself. */
  @Column({ name: 'follow_up_visit_id', type: 'int', unsigned: true, nullable: true })
  followUpVisitId!: number | null;

  @Column({ name: 'file_name', type: 'varchar', length: 200 })
  fileName!: string;

  /** The type found by reading the file's first bytes, not the name or the browser's claim. */
  @Column({ name: 'mime_type', type: 'varchar', length: 40 })
  mimeType!: string;

  @Column({ name: 'size_bytes', type: 'int', unsigned: true })
  sizeBytes!: number;

  @Column({ type: 'char', length: 64 })
  sha256!: string;

  @Column({ name: 'storage_name', type: 'varchar', length: 80 })
  storageName!: string;

  @Column({ name: 'uploaded_by', type: 'int', unsigned: true })
  uploadedBy!: number;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;
}
