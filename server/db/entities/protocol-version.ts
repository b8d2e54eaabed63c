import {
  Column,
  CreateDateColumn,
  Entity,
  Index,
  OneToMany,
  PrimaryGeneratedColumn,
  type Relation,
} from 'typeorm';
import type { ProtocolVersion as ProtocolDefinition } from '../../../shared/protocol/protocol-schema';
import { ProtocolApproval } from './protocol-approval';

export const protocolStatuses = ['draft', 'approved', 'retired', 'discarded'] as const;
export type ProtocolStatus = (typeof protocolStatuses)[number];

export const protocolOrigins = ['shipped', 'imported', 'cloned'] as const;
export type ProtocolOrigin = (typeof protocolOrigins)[number];

/**
 * One version of one protocol. Once approved its definition never changes (the SHA-256 of its
 * canonical JSON is stored beside it, and a trigger refuses changes); a change is a new version.
 */
@Entity({ name: 'protocol_version' })
@Index('uq_protocol_version_key_version', ['key', 'version'], { unique: true })
export class ProtocolVersion {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ name: 'protocol_key', type: 'varchar', length: 64 })
  key!: string;

  @Column({ type: 'int', unsigned: true })
  version!: number;

  @Column({ type: 'varchar', length: 8 })
  kind!: 'pdt' | 'cxl';

  @Column({ type: 'varchar', length: 200 })
  title!: string;

  @Column({ type: 'enum', enum: protocolStatuses })
  status!: ProtocolStatus;

  @Column({ type: 'enum', enum: protocolOrigins })
  origin!: ProtocolOrigin;

  @Column({ type: 'json' })
  definition!: ProtocolDefinition;

  @Column({ type: 'char', length: 64 })
  sha256!: string;

  @Column({ name: 'source_file', type: 'varchar', length: 200, nullable: true })
  sourceFile!: string | null;

  @Column({ name: 'created_by', type: 'int', unsigned: true, nullable: true })
  createdBy!: number | null;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;

  @Column({ name: 'approved_at', type: 'datetime', precision: 3, nullable: true })
  approvedAt!: Date | null;

  @Column({ name: 'retired_at', type: 'datetime', precision: 3, nullable: true })
  retiredAt!: Date | null;

  @Column({ name: 'retired_by', type: 'int', unsigned: true, nullable: true })
  retiredBy!: number | null;

  /** A draft set aside before approval: kept (its number is used), never approvable again. */
  @Column({ name: 'discarded_at', type: 'datetime', precision: 3, nullable: true })
  discardedAt!: Date | null;

  @Column({ name: 'discarded_by', type: 'int', unsigned: true, nullable: true })
  discardedBy!: number | null;

  @Column({ name: 'discard_reason', type: 'varchar', length: 500, nullable: true })
  discardReason!: string | null;

  @OneToMany(() => ProtocolApproval, (approval) => approval.protocolVersion)
  approvals!: Relation<ProtocolApproval[]>;
}
