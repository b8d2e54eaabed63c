import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Entity({ name: 'patient' })
export class Patient {
  @PrimaryGeneratedColumn({ type: 'int', unsigned: true })
  id!: number;

  @Index('uq_patient_record_number', { unique: true })
  @Column({ name: 'record_number', type: 'varchar', length: 20 })
  recordNumber!: string;

  @Column({ name: 'given_name', type: 'varchar', length: 80 })
  givenName!: string;

  @Index('ix_patient_family_name')
  @Column({ name: 'family_name', type: 'varchar', length: 80 })
  familyName!: string;

  /** A calendar date, kept as text so no time zone can shift it. */
  @Column({ name: 'date_of_birth', type: 'date' })
  dateOfBirth!: string;

  @Column({ type: 'varchar', length: 254, nullable: true })
  email!: string | null;

  @Column({ name: 'email_consent', type: 'boolean', default: false })
  emailConsent!: boolean;

  /** The hospital FHIR server's Patient this record was taken from (its base URL and id); null when typed in. */
  @Column({ name: 'fhir_source', type: 'varchar', length: 300, nullable: true })
  fhirSource!: string | null;

  @Column({ name: 'fhir_id', type: 'varchar', length: 64, nullable: true })
  fhirId!: string | null;

  /** When the names and date of birth were last read from the FHIR server. */
  @Column({ name: 'fhir_read_at', type: 'datetime', precision: 3, nullable: true })
  fhirReadAt!: Date | null;

  @CreateDateColumn({
    name: 'created_at',
    type: 'datetime',
    precision: 3,
    default: () => 'CURRENT_TIMESTAMP(3)',
  })
  createdAt!: Date;
}
