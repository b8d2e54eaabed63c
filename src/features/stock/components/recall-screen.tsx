import { useMutation, useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button, buttonClasses } from '../../../components/ui/button';
import { EnvelopeIcon, FileDownloadIcon, MagnifierIcon } from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel } from '../../../components/ui/status-panel';
import { TextField } from '../../../components/ui/text-field';
import { describeError } from '../../../lib/api-client';
import { notifyRecall, recallCsvHref, recallQuery } from '../../../lib/queries/stock';

/** A recalled lot: every patient, eye, date and dose that used it; CSV; e-mail to their clinicians. */
export function RecallScreen({ initialLot }: { initialLot: string }) {
  const [typed, setTyped] = useState(initialLot);
  const [lot, setLot] = useState(initialLot);
  const found = useQuery(recallQuery(lot));
  const notify = useMutation({ mutationFn: () => notifyRecall(lot) });
  return (
    <div className="space-y-6">
      <PageHeader
        title="Recall"
        lead="Search a lot to list every patient who received drug from it, with the eye, date and dose; export the list and tell their clinicians."
      />
      <form
        role="search"
        className="flex flex-wrap items-end gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          notify.reset();
          setLot(typed.trim());
        }}
      >
        <TextField
          label="Lot"
          value={typed}
          onChange={(e) => setTyped(e.target.value)}
          className="min-w-64"
        />
        <Button type="submit" icon={<MagnifierIcon />}>
          Search
        </Button>
      </form>
      {lot.length < 2 ? null : found.isPending ? (
        <LoadingPanel label={`Searching lot ${lot}…`} />
      ) : found.isError ? (
        <Alert tone="error">{describeError(found.error)}</Alert>
      ) : (
        <section aria-labelledby="recall-result" className="space-y-3">
          <h2
            id="recall-result"
            className="text-lg font-semibold text-paper-900"
            aria-live="polite"
          >
            Lot {found.data.lot}: {found.data.rows.length}{' '}
            {found.data.rows.length === 1 ? 'use' : 'uses'}
          </h2>
          {found.data.rows.length > 0 && (
            <>
              <div className="flex flex-wrap gap-3">
                <a
                  className={buttonClasses('secondary')}
                  href={recallCsvHref(found.data.lot)}
                  download
                >
                  <FileDownloadIcon /> Download CSV
                </a>
                <Button
                  icon={<EnvelopeIcon />}
                  busy={notify.isPending}
                  onClick={() => notify.mutate()}
                >
                  E-mail the clinicians
                </Button>
              </div>
              {notify.isSuccess && (
                <Alert tone="info">
                  {notify.data.messages} {notify.data.messages === 1 ? 'message' : 'messages'}{' '}
                  queued in the outbox about {notify.data.patients} treatments.
                </Alert>
              )}
              {notify.isError && <Alert tone="error">{describeError(notify.error)}</Alert>}
              <table className="w-full border-collapse bg-white text-left">
                <thead>
                  <tr className="border-b border-paper-300 text-sm text-paper-700">
                    <th scope="col" className="p-2">
                      Patient
                    </th>
                    <th scope="col" className="p-2">
                      Record
                    </th>
                    <th scope="col" className="p-2">
                      Eye
                    </th>
                    <th scope="col" className="p-2">
                      Date
                    </th>
                    <th scope="col" className="p-2 text-right">
                      Dose
                    </th>
                    <th scope="col" className="p-2">
                      Order
                    </th>
                    <th scope="col" className="p-2">
                      Clinician
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {found.data.rows.map((r) => (
                    <tr key={`${r.orderId}-${r.date}`} className="border-b border-paper-200">
                      <th scope="row" className="p-2 font-semibold">
                        {r.patient.name}
                      </th>
                      <td className="p-2">{r.patient.recordNumber}</td>
                      <td className="p-2">{r.eye}</td>
                      <td className="numerals-steady p-2">{r.date}</td>
                      <td className="numerals-steady p-2 text-right">{r.doseMg ?? '—'} mg</td>
                      <td className="p-2">
                        {r.orderId} ({r.status})
                      </td>
                      <td className="p-2">{r.clinician ?? '—'}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </>
          )}
        </section>
      )}
    </div>
  );
}
