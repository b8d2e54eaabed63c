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
import type { DeviceKind, DeviceStatus } from '../../../shared/schemas/devices';
import { User } from './user';

/**
 * A laser or UV source of the unit, as it stands now. Never deleted: a device taken out of use is
 * marked out of service with its reason, and every change adds a row to device_version.
 */
@Entity({ name: 'device' })
export class Device {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Index('uq_device_name', { unique: true })
  @Column({ type: 'varchar', length: 80 })
  name!: string;

  @Column({ type: 'varchar', length: 8 })
  kind!: DeviceKind;

  @Column({ name: 'wavelength_nm', type: 'double' })
  wavelengthNm!: number;

  @Column({ name: 'serial_number', type: 'varchar', length: 60 })
  serialNumber!: string;

  @Column({ type: 'varchar', length: 80 })
  location!: string;

  @Column({ name: 'power_min_mw', type: 'double', nullable: true })
  powerMinMw!: number | null;

  @Column({ name: 'power_max_mw', type: 'double', nullable: true })
  powerMaxMw!: number | null;

  @Column({ name: 'spot_min_um', type: 'double', nullable: true })
  spotMinUm!: number | null;

  @Column({ name: 'spot_max_um', type: 'double', nullable: true })
  spotMaxUm!: number | null;

  @Column({ name: 'irradiance_min_mw_per_cm2', type: 'double', nullable: true })
  irradianceMinMwPerCm2!: number | null;

  @Column({ name: 'irradiance_max_mw_per_cm2', type: 'double', nullable: true })
  irradianceMaxMwPerCm2!: number | null;

  @Column({ name: 'pulsed_available', type: 'boolean' })
  pulsedAvailable!: boolean;

  @Column({ name: 'service_due_on', type: 'date' })
  serviceDueOn!: string;

  @Column({ type: 'varchar', length: 16 })
  status!: DeviceStatus;

  @Column({ name: 'out_of_service_reason', type: 'varchar', length: 500, nullable: true })
  outOfServiceReason!: string | null;

  /** Counts the changes; device_version keeps each one. */
  @Column({ type: 'int', unsigned: true })
  version!: number;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;
}

/** Each version of a device as it was saved, with who saved it and why (append-only). */
@Entity({ name: 'device_version' })
@Index('uq_device_version', ['deviceId', 'version'], { unique: true })
export class DeviceVersion {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ name: 'device_id', type: 'int', unsigned: true })
  deviceId!: number;

  @ManyToOne(() => Device, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'device_id' })
  device!: Relation<Device>;

  @Column({ type: 'int', unsigned: true })
  version!: number;

  /** The device's fields as saved in this version. */
  @Column({ type: 'json' })
  snapshot!: Record<string, unknown>;

  @Column({ name: 'changed_by_id', type: 'int', unsigned: true })
  changedById!: number;

  @ManyToOne(() => User, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'changed_by_id' })
  changedBy!: Relation<User>;

  @Column({ name: 'changed_at', type: 'datetime', precision: 3 })
  changedAt!: Date;
}

/**
 * A contact lens: its laser-spot factor (device spot = retinal spot ÷ factor) and, apart, its
 * image magnification, which is never used for the spot. A lens is never changed or deleted:
 * one with a new factor is a new lens; an old one is retired.
 */
@Entity({ name: 'lens' })
export class Lens {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Index('uq_lens_name', { unique: true })
  @Column({ type: 'varchar', length: 80 })
  name!: string;

  @Column({ name: 'laser_spot_factor', type: 'double' })
  laserSpotFactor!: number;

  @Column({ name: 'image_magnification', type: 'double' })
  imageMagnification!: number;

  @Column({ type: 'boolean', default: true })
  active!: boolean;

  @Column({ name: 'created_by_id', type: 'int', unsigned: true })
  createdById!: number;

  @ManyToOne(() => User, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'created_by_id' })
  createdBy!: Relation<User>;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;
}

/**
 * A meter reading of a device's output against the value set, judged by the server against a
 * protocol's tolerance when it is recorded (append-only).
 */
@Entity({ name: 'output_check' })
@Index('ix_output_check_device', ['deviceId', 'checkedAt'])
export class OutputCheck {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Column({ name: 'device_id', type: 'int', unsigned: true })
  deviceId!: number;

  @ManyToOne(() => Device, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'device_id' })
  device!: Relation<Device>;

  @Column({ name: 'checked_at', type: 'datetime', precision: 3 })
  checkedAt!: Date;

  @Column({ name: 'checked_by_id', type: 'int', unsigned: true })
  checkedById!: number;

  @ManyToOne(() => User, { onDelete: 'RESTRICT' })
  @JoinColumn({ name: 'checked_by_id' })
  checkedBy!: Relation<User>;

  /** power (mW, a laser) or irradiance (mW/cm², a UV source at the treatment distance). */
  @Column({ type: 'varchar', length: 12 })
  quantity!: 'power' | 'irradiance';

  @Column({ name: 'set_value', type: 'double' })
  setValue!: number;

  @Column({ name: 'measured_value', type: 'double' })
  measuredValue!: number;

  @Column({ name: 'meter_identity', type: 'varchar', length: 80 })
  meterIdentity!: string;

  @Column({ name: 'meter_calibration_due_on', type: 'date' })
  meterCalibrationDueOn!: string;

  @Column({ name: 'tolerance_pct', type: 'double' })
  tolerancePct!: number;

  /** The protocol version whose tolerance judged it ("pdt-standard v3"). */
  @Column({ name: 'tolerance_from', type: 'varchar', length: 80 })
  toleranceFrom!: string;

  @Column({ name: 'difference_pct', type: 'double' })
  differencePct!: number;

  @Column({ type: 'boolean' })
  passed!: boolean;

  @Column({ name: 'order_id', type: 'int', unsigned: true, nullable: true })
  orderId!: number | null;

  @Column({ type: 'varchar', length: 500, nullable: true })
  note!: string | null;
}
