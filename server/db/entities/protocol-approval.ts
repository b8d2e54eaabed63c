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
import { ProtocolVersion } from './protocol-version';
import { User } from './user';

/** One person's approval of one protocol version; two different people make it approved. */
@Entity({ name: 'protocol_approval' })
@Index('uq_protocol_approval_person', ['protocolVersionId', 'userId'], { unique: true })
export class ProtocolApproval {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ name: 'protocol_version_id', type: 'int', unsigned: true })
  protocolVersionId!: number;

  @ManyToOne(() => ProtocolVersion, (v) => v.approvals, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'protocol_version_id' })
  protocolVersion!: Relation<ProtocolVersion>;

  @Column({ name: 'user_id', type: 'int', unsigned: true })
  userId!: number;

  @ManyToOne(() => User, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'user_id' })
  user!: Relation<User>;

  /** The role the person approved in (clinician or pharmacist), as held at that moment. */
  @Column({ name: 'approved_as', type: 'varchar', length: 16 })
  approvedAs!: string;

  /**
   * What the approver's electronic signature means (shared/protocol/approval-signature.ts), stated
   * on screen as they typed their password. Null on approvals given before it was asked.
   */
  @Column({ type: 'varchar', length: 32, nullable: true })
  meaning!: string | null;

  /** The SHA-256 of the definition the person saw, so an approval can't carry over to other content. */
  @Column({ name: 'definition_sha256', type: 'char', length: 64 })
  definitionSha256!: string;

  @CreateDateColumn({
    name: 'approved_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  approvedAt!: Date;
}
