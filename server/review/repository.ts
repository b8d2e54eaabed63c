import type { Readable } from 'node:stream';
import { IsNull, type DataSource, type SelectQueryBuilder } from 'typeorm';
import type { AuditFilter, AuditTrailQuery, DoseRecordFilter } from '../../shared/schemas/reviews';
import { AuditEvent } from '../db/entities/audit-event';
import { DeviationRow } from '../db/entities/deviation';
import { DeviationReview } from '../db/entities/deviation-review';
import { DoseRecordRow } from '../db/entities/dose-record';
import { ProtocolVersion } from '../db/entities/protocol-version';
import { TreatmentOrder } from '../db/entities/treatment-order';
import { managerOf, type Transaction } from '../db/unit-of-work';

export interface DateRange {
  from?: Date;
  to?: Date;
}

const deviationSort: Record<AuditFilter['sort'], string> = {
  detectedAt: 'd.detected_at',
  severity: 'd.severity',
  type: 'd.type',
  status: 'd.review_status',
};

export function createReviewRepository(dataSource: DataSource) {
  /** Protocol versions matching a key (and version): a handful of ids, so filters stay on the indexed column. */
  async function protocolIds(filter: {
    protocol?: string;
    version?: number;
  }): Promise<number[] | null> {
    if (!filter.protocol) return null;
    const rows = await dataSource.getRepository(ProtocolVersion).find({
      where: { key: filter.protocol, ...(filter.version ? { version: filter.version } : {}) },
      select: { id: true },
    });
    return rows.map((r) => r.id);
  }

  function filteredDeviations(
    filter: AuditFilter,
    range: DateRange,
    ids: number[] | null,
  ): SelectQueryBuilder<DeviationRow> {
    const qb = dataSource
      .getRepository(DeviationRow)
      .createQueryBuilder('d')
      .where('d.withdrawn_at IS NULL');
    if (range.from) qb.andWhere('d.detected_at >= :from', { from: range.from });
    if (range.to) qb.andWhere('d.detected_at < :to', { to: range.to });
    if (ids) qb.andWhere(ids.length ? 'd.protocol_version_id IN (:...ids)' : '1 = 0', { ids });
    if (filter.type) qb.andWhere('d.type = :type', { type: filter.type });
    if (filter.severity) qb.andWhere('d.severity = :severity', { severity: filter.severity });
    if (filter.status) qb.andWhere('d.review_status = :status', { status: filter.status });
    if (filter.staff)
      qb.andWhere(
        'EXISTS (SELECT 1 FROM session_participant sp WHERE sp.order_id = d.order_id AND sp.user_id = :staff)',
        { staff: filter.staff },
      );
    return qb;
  }

  function filteredRecords(
    filter: DoseRecordFilter,
    range: DateRange,
    ids: number[] | null,
  ): SelectQueryBuilder<DoseRecordRow> {
    const qb = dataSource
      .getRepository(DoseRecordRow)
      .createQueryBuilder('r')
      .where("r.outcome IN ('completed', 'stopped')");
    if (filter.outcome) qb.andWhere('r.outcome = :outcome', { outcome: filter.outcome });
    if (range.from) qb.andWhere('r.ended_at >= :from', { from: range.from });
    if (range.to) qb.andWhere('r.ended_at < :to', { to: range.to });
    if (ids) qb.andWhere(ids.length ? 'r.protocol_version_id IN (:...ids)' : '1 = 0', { ids });
    if (filter.staff)
      qb.andWhere(
        'EXISTS (SELECT 1 FROM session_participant sp WHERE sp.order_id = r.order_id AND sp.user_id = :staff)',
        { staff: filter.staff },
      );
    return qb;
  }

  /** The columns one queue row or CSV line needs, joined after the page is chosen. */
  const deviationColumns = (qb: SelectQueryBuilder<DeviationRow>) =>
    qb
      .innerJoin('treatment_order', 'o', 'o.id = d.order_id')
      .innerJoin('protocol_version', 'pv', 'pv.id = o.protocol_version_id')
      .innerJoin('patient', 'p', 'p.id = o.patient_id')
      .leftJoin('user', 'rv', 'rv.id = d.reviewed_by')
      .select([
        'd.id AS id',
        'd.order_id AS orderId',
        'd.type AS type',
        'd.severity AS severity',
        'd.expected AS expected',
        'd.actual AS actual',
        'd.unit AS unit',
        'd.message AS message',
        'd.detected_at AS detectedAt',
        'd.review_status AS reviewStatus',
        'd.classification AS classification',
        'd.reviewed_at AS reviewedAt',
        'rv.display_name AS reviewedBy',
        'o.eye AS eye',
        'pv.protocol_key AS protocolKey',
        'pv.version AS protocolVersion',
        'pv.title AS protocolTitle',
        'p.record_number AS recordNumber',
        '(SELECT r.comment FROM deviation_review r WHERE r.deviation_id = d.id ORDER BY r.id DESC LIMIT 1) AS reviewComment',
      ]);

  // The order's facts are on the record itself (see DoseRecordRow): the orders are not read.
  const recordColumns = (qb: SelectQueryBuilder<DoseRecordRow>) =>
    qb
      .innerJoin('protocol_version', 'pv', 'pv.id = r.protocol_version_id')
      .innerJoin('patient', 'p', 'p.id = r.patient_id')
      .select([
        'r.order_id AS orderId',
        'r.outcome AS outcome',
        'r.started_at AS startedAt',
        'r.ended_at AS endedAt',
        'r.on_time_s AS onTimeS',
        'r.delivered_fluence_j_per_cm2 AS deliveredFluenceJPerCm2',
        'r.volume_given_ml AS volumeGivenMl',
        'r.deviation_count AS deviationCount',
        // The device part of the record (records from before devices have none: NULL).
        "JSON_UNQUOTE(JSON_EXTRACT(r.record, '$.deviceUsed.device.name')) AS deviceName",
        "JSON_UNQUOTE(JSON_EXTRACT(r.record, '$.deviceUsed.device.serialNumber')) AS deviceSerial",
        "JSON_UNQUOTE(JSON_EXTRACT(r.record, '$.deviceUsed.lens.name')) AS lensName",
        "JSON_EXTRACT(r.record, '$.deviceUsed.lens.laserSpotFactor') AS lensFactor",
        "JSON_EXTRACT(r.record, '$.deviceUsed.powerSetMw') AS powerSetMw",
        "JSON_EXTRACT(r.record, '$.deviceUsed.spotSetUm') AS spotSetUm",
        "JSON_EXTRACT(r.record, '$.deviceUsed.irradianceSetMwPerCm2') AS irradianceSetMwPerCm2",
        "JSON_EXTRACT(r.record, '$.deviceUsed.measuredIrradianceMwPerCm2') AS measuredIrradianceMwPerCm2",
        "JSON_UNQUOTE(JSON_EXTRACT(r.record, '$.deviceUsed.fluenceBasis')) AS fluenceBasis",
        'r.planned_dose_mg AS doseMg',
        'r.planned_fluence_j_per_cm2 AS plannedFluenceJPerCm2',
        'r.eye AS eye',
        'pv.protocol_key AS protocolKey',
        'pv.version AS protocolVersion',
        'pv.kind AS kind',
        'p.record_number AS recordNumber',
      ]);

  return {
    protocolIds,

    /** One page of the queue: the ids by the indexed filter and order first, then their details. */
    async deviationPage(filter: AuditFilter, range: DateRange) {
      const ids = await protocolIds(filter);
      const direction = filter.direction === 'asc' ? 'ASC' : 'DESC';
      const pageQuery = filteredDeviations(filter, range, ids)
        .select('d.id', 'id')
        .orderBy(deviationSort[filter.sort], direction)
        .addOrderBy('d.id', direction)
        .offset((filter.page - 1) * filter.pageSize)
        .limit(filter.pageSize);
      const [pageIds, total] = await Promise.all([
        pageQuery.getRawMany<{ id: number }>(),
        filteredDeviations(filter, range, ids).getCount(),
      ]);
      if (pageIds.length === 0) return { rows: [], total };
      const rows = await deviationColumns(
        dataSource.getRepository(DeviationRow).createQueryBuilder('d'),
      )
        .where('d.id IN (:...ids)', { ids: pageIds.map((r) => r.id) })
        .orderBy(deviationSort[filter.sort], direction)
        .addOrderBy('d.id', direction)
        .getRawMany();
      return { rows, total };
    },

    /** The SQL of the page query, for EXPLAIN in tests and measurements. */
    async deviationPageSql(filter: AuditFilter, range: DateRange) {
      const ids = await protocolIds(filter);
      const direction = filter.direction === 'asc' ? 'ASC' : 'DESC';
      return filteredDeviations(filter, range, ids)
        .select('d.id', 'id')
        .orderBy(deviationSort[filter.sort], direction)
        .addOrderBy('d.id', direction)
        .offset((filter.page - 1) * filter.pageSize)
        .limit(filter.pageSize)
        .getQueryAndParameters();
    },

    async deviationsForExport(filter: AuditFilter, range: DateRange) {
      const ids = await protocolIds(filter);
      const direction = filter.direction === 'asc' ? 'ASC' : 'DESC';
      return deviationColumns(filteredDeviations(filter, range, ids))
        .orderBy(deviationSort[filter.sort], direction)
        .addOrderBy('d.id', direction)
        .getQueryAndParameters();
    },

    async recordPage(filter: DoseRecordFilter, range: DateRange) {
      const ids = await protocolIds(filter);
      const direction = filter.direction === 'asc' ? 'ASC' : 'DESC';
      const sort = filter.sort === 'fluence' ? 'r.delivered_fluence_j_per_cm2' : 'r.ended_at';
      const pageIds = await filteredRecords(filter, range, ids)
        .select('r.order_id', 'orderId')
        .orderBy(sort, direction)
        .addOrderBy('r.order_id', direction)
        .offset((filter.page - 1) * filter.pageSize)
        .limit(filter.pageSize)
        .getRawMany<{ orderId: number }>();
      const total = await filteredRecords(filter, range, ids).getCount();
      if (pageIds.length === 0) return { rows: [], total };
      const rows = await recordColumns(
        dataSource.getRepository(DoseRecordRow).createQueryBuilder('r'),
      )
        .where('r.order_id IN (:...ids)', { ids: pageIds.map((r) => r.orderId) })
        .orderBy(sort, direction)
        .addOrderBy('r.order_id', direction)
        .getRawMany();
      return { rows, total };
    },

    async recordsForExport(filter: DoseRecordFilter, range: DateRange) {
      const ids = await protocolIds(filter);
      const direction = filter.direction === 'asc' ? 'ASC' : 'DESC';
      const sort = filter.sort === 'fluence' ? 'r.delivered_fluence_j_per_cm2' : 'r.ended_at';
      return recordColumns(filteredRecords(filter, range, ids))
        .orderBy(sort, direction)
        .addOrderBy('r.order_id', direction)
        .getQueryAndParameters();
    },

    /** Sessions and sessions with a deviation per unit month and protocol version. */
    /** Standing deviations of finished sessions per unit month, protocol version, type and severity. */
    async monthlyByType(filter: { fromMonth?: string; toMonth?: string; protocol?: string }) {
      const ids = await protocolIds(filter);
      const qb = dataSource
        .getRepository(DeviationRow)
        .createQueryBuilder('d')
        .innerJoin('dose_record', 'r', 'r.order_id = d.order_id')
        .innerJoin('protocol_version', 'pv', 'pv.id = r.protocol_version_id')
        .select([
          'r.local_month AS month',
          'pv.protocol_key AS protocolKey',
          'pv.version AS protocolVersion',
          'd.type AS type',
          'd.severity AS severity',
        ])
        .addSelect('COUNT(*)', 'deviations')
        .where(
          "d.withdrawn_at IS NULL AND r.outcome IN ('completed', 'stopped') AND r.local_month IS NOT NULL",
        )
        .groupBy('r.local_month')
        .addGroupBy('pv.id')
        .addGroupBy('d.type')
        .addGroupBy('d.severity')
        .orderBy('r.local_month', 'ASC')
        .addOrderBy('pv.protocol_key', 'ASC')
        .addOrderBy('d.type', 'ASC');
      if (filter.fromMonth)
        qb.andWhere('r.local_month >= :fromMonth', { fromMonth: filter.fromMonth });
      if (filter.toMonth) qb.andWhere('r.local_month <= :toMonth', { toMonth: filter.toMonth });
      if (ids) qb.andWhere(ids.length ? 'r.protocol_version_id IN (:...ids)' : '1 = 0', { ids });
      return qb.getRawMany<{
        month: string;
        protocolKey: string;
        protocolVersion: number;
        type: string;
        severity: string;
        deviations: string;
      }>();
    },

    async monthly(filter: { fromMonth?: string; toMonth?: string; protocol?: string }) {
      const ids = await protocolIds(filter);
      const qb = dataSource
        .getRepository(DoseRecordRow)
        .createQueryBuilder('r')
        .innerJoin('protocol_version', 'pv', 'pv.id = r.protocol_version_id')
        .select([
          'r.local_month AS month',
          'pv.protocol_key AS protocolKey',
          'pv.version AS protocolVersion',
          'pv.title AS protocolTitle',
        ])
        .addSelect('COUNT(*)', 'sessions')
        .addSelect('SUM(r.deviation_count > 0)', 'sessionsWithDeviation')
        .where("r.outcome IN ('completed', 'stopped') AND r.local_month IS NOT NULL")
        .groupBy('r.local_month')
        .addGroupBy('pv.id')
        .orderBy('r.local_month', 'ASC')
        .addOrderBy('pv.protocol_key', 'ASC');
      if (filter.fromMonth)
        qb.andWhere('r.local_month >= :fromMonth', { fromMonth: filter.fromMonth });
      if (filter.toMonth) qb.andWhere('r.local_month <= :toMonth', { toMonth: filter.toMonth });
      if (ids) qb.andWhere(ids.length ? 'r.protocol_version_id IN (:...ids)' : '1 = 0', { ids });
      return qb.getRawMany<{
        month: string;
        protocolKey: string;
        protocolVersion: number;
        protocolTitle: string;
        sessions: string;
        sessionsWithDeviation: string;
      }>();
    },

    findDeviation: (id: number) => dataSource.getRepository(DeviationRow).findOneBy({ id }),

    /** Locks a deviation for the rest of the transaction, so two reviewers cannot both decide it. */
    lockDeviation: (tx: Transaction, id: number) =>
      managerOf(tx)
        .getRepository(DeviationRow)
        .findOne({ where: { id }, lock: { mode: 'pessimistic_write' } }),

    /** The deviation's current judgement, and the line in its history that records the change. */
    async judge(
      tx: Transaction,
      id: number,
      judgement: Pick<
        DeviationRow,
        'reviewStatus' | 'classification' | 'reviewedBy' | 'reviewedAt'
      >,
      history: Pick<DeviationReview, 'reviewerId' | 'action' | 'classification' | 'comment'>,
    ): Promise<void> {
      await managerOf(tx).update(DeviationRow, { id }, judgement);
      await managerOf(tx)
        .getRepository(DeviationReview)
        .insert({ deviationId: id, ...history });
    },

    /** What an order's status after review depends on, with the order row locked; null before a record exists. */
    async reviewStateOf(tx: Transaction, orderId: number) {
      const manager = managerOf(tx);
      const order = await manager
        .getRepository(TreatmentOrder)
        .findOne({ where: { id: orderId }, lock: { mode: 'pessimistic_write' } });
      const record = await manager.getRepository(DoseRecordRow).findOneBy({ orderId });
      if (!order || !record) return null;
      const openDeviations = await manager
        .getRepository(DeviationRow)
        .count({ where: { orderId, reviewStatus: 'open', withdrawnAt: IsNull() } });
      return { status: order.status, outcome: record.outcome, openDeviations };
    },

    /** Hands `consume` a cursor over the rows of an export query; the connection is released after. */
    async streamRows(
      [sql, params]: [string, unknown[]],
      consume: (rows: Readable) => Promise<void>,
    ): Promise<void> {
      const runner = dataSource.createQueryRunner();
      try {
        await consume(await runner.stream(sql, params));
      } finally {
        await runner.release();
      }
    },
    reviewsOf: (deviationId: number) =>
      dataSource
        .getRepository(DeviationReview)
        .createQueryBuilder('r')
        .leftJoin('user', 'u', 'u.id = r.reviewer_id')
        .select([
          'r.id AS id',
          'r.action AS action',
          'r.classification AS classification',
          'r.comment AS comment',
          'r.created_at AS createdAt',
          'u.display_name AS reviewer',
          'r.reviewer_id AS reviewerId',
        ])
        .where('r.deviation_id = :deviationId', { deviationId })
        .orderBy('r.id', 'ASC')
        .getRawMany(),
    participantsOf: (
      orderId: number,
    ): Promise<{ userId: number; part: string; displayName: string }[]> =>
      dataSource.query(
        'SELECT sp.user_id AS userId, sp.part AS part, u.display_name AS displayName FROM session_participant sp JOIN user u ON u.id = sp.user_id WHERE sp.order_id = ? ORDER BY sp.part',
        [orderId],
      ),

    auditTrail: async (query: AuditTrailQuery, range: DateRange) => {
      const qb = dataSource
        .getRepository(AuditEvent)
        .createQueryBuilder('a')
        .leftJoin('user', 'u', 'u.id = a.actor_user_id');
      if (range.from) qb.andWhere('a.occurred_at >= :from', { from: range.from });
      if (range.to) qb.andWhere('a.occurred_at < :to', { to: range.to });
      if (query.action) qb.andWhere('a.action = :action', { action: query.action });
      if (query.actor) qb.andWhere('a.actor_user_id = :actor', { actor: query.actor });
      if (query.entityType)
        qb.andWhere('a.entity_type = :entityType', { entityType: query.entityType });
      if (query.entityId) qb.andWhere('a.entity_id = :entityId', { entityId: query.entityId });
      const total = await qb.clone().getCount();
      const rows = await qb
        .select([
          'a.id AS id',
          'a.occurred_at AS occurredAt',
          'a.action AS action',
          'a.entity_type AS entityType',
          'a.entity_id AS entityId',
          'a.actor_user_id AS actorUserId',
          'u.display_name AS actor',
          'a.ip_address AS ipAddress',
          'a.details AS details',
        ])
        .orderBy('a.id', query.direction === 'asc' ? 'ASC' : 'DESC')
        .offset((query.page - 1) * query.pageSize)
        .limit(query.pageSize)
        .getRawMany();
      return { rows, total };
    },
  };
}

export type ReviewRepository = ReturnType<typeof createReviewRepository>;
