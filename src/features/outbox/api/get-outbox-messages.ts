// The outbox's shapes and fetcher: src/lib/queries/outbox.ts.
export {
  getOutboxMessages,
  outboxStatuses,
  type OutboxMessage,
  type OutboxStatus,
} from '../../../lib/queries/outbox';
