import { In, type DataSource } from 'typeorm';
import { OutboxMessage } from '../db/entities/outbox-message';
import { managerOf, type Transaction } from '../db/unit-of-work';

export interface NewMessage {
  kind: string;
  recipients: string[];
  subject: string;
  body: string;
  related?: { type: string; id: string | number };
}

/** Writes a message to the outbox inside the caller's transaction, so mail and change commit together. */
export async function enqueueMessage(tx: Transaction, message: NewMessage): Promise<void> {
  if (message.recipients.length === 0) return;
  await managerOf(tx)
    .getRepository(OutboxMessage)
    .insert({
      kind: message.kind,
      recipients: message.recipients,
      subject: message.subject,
      body: message.body,
      relatedType: message.related?.type ?? null,
      relatedId: message.related ? String(message.related.id) : null,
    });
}

export function createOutboxRepository(dataSource: DataSource) {
  const repo = dataSource.getRepository(OutboxMessage);
  return {
    /**
     * Claims a batch of due messages by pushing their next attempt a lease into the future (under
     * SKIP LOCKED), so several app instances can send from one database without sending twice.
     */
    claimDue: (batchSize: number, leaseS: number): Promise<OutboxMessage[]> =>
      dataSource.transaction(async (manager) => {
        const rows: { id: number }[] = await manager.query(
          `SELECT id FROM outbox_message WHERE status = 'pending' AND next_attempt_at <= NOW(3) ORDER BY id LIMIT ? FOR UPDATE SKIP LOCKED`,
          [batchSize],
        );
        if (rows.length === 0) return [];
        const ids = rows.map((r) => r.id);
        await manager.query(
          `UPDATE outbox_message SET next_attempt_at = NOW(3) + INTERVAL ? SECOND WHERE id IN (?)`,
          [leaseS, ids],
        );
        return manager.getRepository(OutboxMessage).findBy({ id: In(ids) });
      }),

    update: (
      id: number,
      changes: Partial<
        Pick<
          OutboxMessage,
          'status' | 'attempts' | 'sentAt' | 'lastError' | 'body' | 'nextAttemptAt'
        >
      >,
    ) => repo.update({ id }, changes),

    /** The newest messages first, for the outbox page. */
    newest: (limit: number) => repo.find({ order: { id: 'DESC' }, take: limit }),
  };
}

export type OutboxRepository = ReturnType<typeof createOutboxRepository>;
