import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  JoinColumn,
  ManyToOne,
  PrimaryGeneratedColumn,
  UpdateDateColumn,
  VersionColumn,
  type Relation,
} from 'typeorm';
import type { DosePlan, PlanInputs } from '../../../shared/schemas/calculation';
import {
  orderStatuses,
  type ChecklistAnswer,
  type OrderStatus,
} from '../../../shared/schemas/orders';
import { Patient } from './patient';
import { ProtocolVersion } from './protocol-version';
import { User } from './user';

/**
 * One revision of a treatment order. Signing freezes the plan; an amendment is a new row that
 * points back at the revision it replaces, which stays readable.
 */
@Entity({ name: 'treatment_order' })
@Index('ix_order_status_created', ['status', 'createdAt'])
@Index('ix_order_patient_eye', ['patientId', 'eye', 'createdAt'])
@Index('ix_order_protocol', ['protocolVersionId', 'createdAt'])
// One amendment per revision, whatever two clinicians send at once.
@Index('uq_order_previous_revision', ['previousRevisionId'], { unique: true })
export class TreatmentOrder {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ name: 'patient_id', type: 'int', unsigned: true })
  patientId!: number;

  @ManyToOne(() => Patient, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'patient_id' })
  patient!: Relation<Patient>;

  @Column({ type: 'enum', enum: ['right', 'left'] })
  eye!: 'right' | 'left';

  @Column({ name: 'protocol_version_id', type: 'int', unsigned: true })
  protocolVersionId!: number;

  @ManyToOne(() => ProtocolVersion, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'protocol_version_id' })
  protocolVersion!: Relation<ProtocolVersion>;

  /** SHA-256 of the canonical JSON of the definition this order was planned on; checked on every read. */
  @Column({ name: 'protocol_sha256', type: 'char', length: 64 })
  protocolSha256!: string;

  @Column({ type: 'enum', enum: orderStatuses })
  status!: OrderStatus;

  @Column({ type: 'smallint', unsigned: true, default: 1 })
  revision!: number;

  @Column({ name: 'previous_revision_id', type: 'int', unsigned: true, nullable: true })
  previousRevisionId!: number | null;

  @Column({ name: 'amendment_reason', type: 'varchar', length: 500, nullable: true })
  amendmentReason!: string | null;

  @Column({ type: 'json' })
  inputs!: PlanInputs;

  /** The dose plan as computed by the server; frozen at signing. */
  @Column({ type: 'json' })
  plan!: DosePlan;

  @Column({ name: 'engine_version', type: 'varchar', length: 20 })
  engineVersion!: string;

  @Column({ type: 'json' })
  checklist!: ChecklistAnswer[];

  @Column({ name: 'soft_limit_reasons', type: 'json' })
  softLimitReasons!: Record<string, string>;

  @Column({ name: 'retreatment_reason', type: 'varchar', length: 500, nullable: true })
  retreatmentReason!: string | null;

  /** Needed when the weight differs from the patient's last recorded weight beyond the unit's rule. */
  @Column({ name: 'weight_change_reason', type: 'varchar', length: 500, nullable: true })
  weightChangeReason!: string | null;

  /** Needed when the order uses a protocol version that a newer approved version has superseded. */
  @Column({ name: 'superseded_version_reason', type: 'varchar', length: 500, nullable: true })
  supersededVersionReason!: string | null;

  /** Needed when the patient had another open order for the same eye and kind at saving or signing. */
  @Column({ name: 'duplicate_order_reason', type: 'varchar', length: 500, nullable: true })
  duplicateOrderReason!: string | null;

  @Column({ type: 'text', nullable: true })
  note!: string | null;

  /** The clinician acknowledged that a stroma below the minimum must first be swollen (CXL with a swelling step). */
  @Column({ name: 'swelling_acknowledged', type: 'boolean', default: false })
  swellingAcknowledged!: boolean;

  @Column({ name: 'created_by', type: 'int', unsigned: true })
  createdById!: number;

  @ManyToOne(() => User, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'created_by' })
  createdBy!: Relation<User>;

  @Column({ name: 'signed_by', type: 'int', unsigned: true, nullable: true })
  signedById!: number | null;

  @ManyToOne(() => User, { onDelete: 'RESTRICT', nullable: true })
  @JoinColumn({ name: 'signed_by' })
  signedBy!: Relation<User> | null;

  @Column({ name: 'signed_at', type: 'datetime', precision: 3, nullable: true })
  signedAt!: Date | null;

  @Column({ name: 'signature_meaning', type: 'varchar', length: 20, nullable: true })
  signatureMeaning!: string | null;

  @Column({ name: 'return_comment', type: 'varchar', length: 1000, nullable: true })
  returnComment!: string | null;

  @Column({ name: 'beyond_use_at', type: 'datetime', precision: 3, nullable: true })
  beyondUseAt!: Date | null;

  /** Set once, with the status move to cancelled. */
  @Column({ name: 'cancelled_at', type: 'datetime', precision: 3, nullable: true })
  cancelledAt!: Date | null;

  @Column({ name: 'cancelled_by', type: 'int', unsigned: true, nullable: true })
  cancelledById!: number | null;

  @ManyToOne(() => User, { onDelete: 'RESTRICT', nullable: true })
  @JoinColumn({ name: 'cancelled_by' })
  cancelledBy!: Relation<User> | null;

  @Column({ name: 'cancel_reason', type: 'varchar', length: 500, nullable: true })
  cancelReason!: string | null;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;

  /**
   * Goes up by one on every write to the row (TypeORM adds it to each UPDATE). A client sends the
   * version it read with an edit, a signature or an amendment; the server refuses a stale one.
   */
  @VersionColumn({ name: 'row_version', type: 'int', unsigned: true, default: 1 })
  version!: number;

  @UpdateDateColumn({
    name: 'updated_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
    onUpdate: 'CURRENT_TIMESTAMP(3)',
  })
  updatedAt!: Date;
}
