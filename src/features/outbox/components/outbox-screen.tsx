import { useQuery } from '@tanstack/react-query';
import { formatUnitTime } from '../../../../shared/format/figures';
import { Button } from '../../../components/ui/button';
import { AlertIcon, OutboxTrayIcon, ReloadIcon } from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel, StatusPanel } from '../../../components/ui/status-panel';
import { unitTimeZone, unitTimeZoneLabel } from '../../../config/unit-time-zone';
import { describeError } from '../../../lib/api-client';
import { outboxQueries } from '../api/outbox-queries';
import type { OutboxMessage } from '../api/get-outbox-messages';
import { FhirDeliveries } from './fhir-deliveries';
import { messageLook, MessageStatus } from './message-status';

const kindWords: Record<string, string> = {
  'order-signed': 'Order signed, to the pharmacists',
  'order-returned': 'Order sent back, to the clinician',
  'session-deviations': 'Deviations in a session, to the auditors',
  'discharge-advice': 'Discharge advice, to the patient',
};

function when(iso: string | null): string {
  return formatUnitTime(iso, unitTimeZone, 'record');
}

export function OutboxScreen() {
  const messagesQuery = useQuery({ ...outboxQueries.list(), refetchInterval: 30_000 });
  const messages = messagesQuery.data;
  const counts = messages
    ? {
        waiting: messages.filter((m) => m.status === 'pending').length,
        sent: messages.filter((m) => m.status === 'sent').length,
        refused: messages.filter((m) => m.status === 'failed').length,
      }
    : null;

  return (
    <>
      <PageHeader
        title="Outbox"
        lead="E-mail that Luxtempo sends is kept here until the mail server accepts it, so nothing is lost while the server is down. The newest 200 messages are listed; the list refreshes every 30 seconds."
        actions={
          <Button
            variant="secondary"
            icon={<ReloadIcon />}
            busy={messagesQuery.isFetching && !messagesQuery.isPending}
            onClick={() => void messagesQuery.refetch()}
          >
            Refresh
          </Button>
        }
      />
      {messagesQuery.isPending ? (
        <LoadingPanel label="Loading the outbox…" />
      ) : messagesQuery.isError && !messages ? (
        <StatusPanel
          role="alert"
          icon={<AlertIcon className="size-6" />}
          title="The outbox could not be loaded"
          actions={
            <Button
              variant="secondary"
              icon={<ReloadIcon />}
              busy={messagesQuery.isFetching}
              onClick={() => void messagesQuery.refetch()}
            >
              Try again
            </Button>
          }
        >
          <p>{describeError(messagesQuery.error)}</p>
        </StatusPanel>
      ) : !messages || messages.length === 0 ? (
        <StatusPanel icon={<OutboxTrayIcon className="size-6" />} title="No messages yet">
          <p>
            Messages appear here when an order is signed or sent back, or discharge advice is
            e-mailed.
          </p>
        </StatusPanel>
      ) : (
        <div className="space-y-4">
          {messagesQuery.isError && (
            <p
              role="alert"
              className="flex items-center gap-2 rounded-lg border border-alarm-700 bg-alarm-50 px-4 py-3 text-alarm-800"
            >
              <AlertIcon className="size-5" />
              The list may be out of date: {describeError(messagesQuery.error)}
            </p>
          )}
          {counts && (
            <p className="numerals-steady text-paper-800">
              {counts.waiting} waiting or retrying · {counts.sent} sent · {counts.refused} refused.
              Loaded {when(new Date(messagesQuery.dataUpdatedAt).toISOString())}; times are{' '}
              {unitTimeZoneLabel}.
            </p>
          )}
          <OutboxTable messages={messages} />
        </div>
      )}
      <FhirDeliveries />
    </>
  );
}

function OutboxTable({ messages }: { messages: OutboxMessage[] }) {
  return (
    // A wide table scrolls on its own; the region can take focus so keyboard users can scroll it.
    <div
      role="region"
      aria-label="Outbox messages"
      tabIndex={0}
      className="overflow-x-auto rounded-xl border border-paper-200 bg-white"
    >
      <table className="w-full min-w-[60rem] border-collapse text-left">
        <thead>
          <tr className="border-b-2 border-paper-300 bg-paper-100 text-sm text-paper-700">
            <th scope="col" className="px-4 py-2.5 font-medium">
              Message
            </th>
            <th scope="col" className="px-4 py-2.5 font-medium">
              Recipients
            </th>
            <th scope="col" className="px-4 py-2.5 font-medium">
              Status
            </th>
            <th scope="col" className="px-4 py-2.5 text-right font-medium">
              Attempts
            </th>
            <th scope="col" className="px-4 py-2.5 font-medium">
              Next attempt
            </th>
            <th scope="col" className="px-4 py-2.5 font-medium">
              Last error
            </th>
            <th scope="col" className="px-4 py-2.5 font-medium">
              Sent
            </th>
          </tr>
        </thead>
        <tbody>
          {messages.map((message) => {
            const look = messageLook(message);
            return (
              <tr key={message.id} className="border-b border-paper-200 align-top last:border-b-0">
                <td className="max-w-80 px-4 py-3">
                  <span className="block font-medium text-paper-950 [overflow-wrap:anywhere]">
                    {message.subject}
                  </span>
                  <span className="block text-sm text-paper-700">
                    {kindWords[message.kind] ?? message.kind} · queued {when(message.createdAt)}
                  </span>
                </td>
                <td className="px-4 py-3 text-sm text-paper-800">
                  {message.recipients.length === 0 ? (
                    <span className="text-paper-700">Nobody (no active address)</span>
                  ) : (
                    <ul>
                      {message.recipients.map((recipient) => (
                        <li key={recipient} className="[overflow-wrap:anywhere]">
                          {recipient}
                        </li>
                      ))}
                    </ul>
                  )}
                </td>
                <td className="px-4 py-3">
                  <MessageStatus message={message} />
                </td>
                <td className="numerals-steady px-4 py-3 text-right text-paper-900">
                  {message.attempts}
                </td>
                <td className="numerals-steady px-4 py-3 text-sm whitespace-nowrap text-paper-800">
                  {look === 'waiting' || look === 'retrying' ? when(message.nextAttemptAt) : '—'}
                </td>
                <td className="max-w-64 px-4 py-3 text-sm text-paper-800 [overflow-wrap:anywhere]">
                  {message.lastError ?? '—'}
                </td>
                <td className="numerals-steady px-4 py-3 text-sm whitespace-nowrap text-paper-800">
                  {when(message.sentAt)}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
