import { useQuery } from '@tanstack/react-query';
import {
  formatCalendarDate,
  formatQuantity,
  formatUnitTime,
} from '../../../../shared/format/figures';
import { Alert } from '../../../components/ui/alert';
import { LinkButton } from '../../../components/ui/button';
import { ArrowLeftIcon } from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { LoadingPanel } from '../../../components/ui/status-panel';
import { paths } from '../../../config/paths';
import { unitTimeZone } from '../../../config/unit-time-zone';
import { describeError } from '../../../lib/api-client';
import { vialPlanQuery } from '../../../lib/queries/lists';

const at = (iso: string) => formatUnitTime(iso, unitTimeZone, 'short');
const mg = (value: number) => formatQuantity(value, 'mg', 2);

/** The vials a list's doses need and the order to prepare them in. */
export function VialPlanScreen({ listId }: { listId: number }) {
  const plan = useQuery(vialPlanQuery(listId));
  if (plan.isPending) return <LoadingPanel label="Working out the vial plan…" />;
  if (plan.isError)
    return (
      <Alert tone="error" title="The vial plan could not be worked out">
        {describeError(plan.error)}
      </Alert>
    );
  const p = plan.data;
  const day = formatCalendarDate(p.list.listDate, 'day');
  return (
    <div className="space-y-6">
      <PageHeader
        title={`Vial plan · ${p.list.room}`}
        lead={`${day}. Doses in the order they must be ready: each infusion starts the protocol's light-start offset before its slot.`}
        actions={
          <LinkButton variant="secondary" icon={<ArrowLeftIcon />} to={paths.lists.getHref()}>
            Treatment lists
          </LinkButton>
        }
      />
      <Alert
        tone="info"
        title={p.sharingAllowed ? 'Vial sharing is allowed by the unit' : 'Vial sharing is off'}
      >
        <p>
          {p.sharingAllowed
            ? 'The plan lets one vial serve more than one patient where the drug is still within its beyond-use time when the last infusion ends.'
            : 'Each dose opens its own vials. The unit’s setting VIAL_SHARING_ALLOWED turns sharing on where written policy allows it.'}
        </p>
        <blockquote className="mt-2 border-l-2 border-iris-300 pl-3 italic">{p.caution}</blockquote>
      </Alert>
      <dl className="grid gap-3 sm:grid-cols-4">
        {[
          ['Drug for the list', mg(p.totalDoseMg)],
          ['Vials, one per patient', String(p.vialsUnshared)],
          ['Vials in this plan', String(p.vialsPlanned)],
          ['Vials saved', String(p.vialsSaved)],
        ].map(([term, value]) => (
          <div key={term} className="rounded-xl border border-paper-200 bg-white px-4 py-3">
            <dt className="text-sm text-paper-700">{term}</dt>
            <dd className="numerals-steady text-2xl font-semibold text-paper-950">{value}</dd>
          </div>
        ))}
      </dl>
      {p.steps.length === 0 ? (
        <p className="rounded-xl border border-dashed border-paper-400 bg-paper-100 px-5 py-3 text-paper-800">
          No verteporfin doses are booked on this list.
        </p>
      ) : (
        <>
          <table className="w-full border-collapse rounded-xl bg-white text-left">
            <caption className="mb-2 text-left text-lg font-semibold text-paper-900">
              Order of preparation
            </caption>
            <thead>
              <tr className="border-b border-paper-300 text-sm text-paper-700">
                <th scope="col" className="p-2">
                  Ready by
                </th>
                <th scope="col" className="p-2">
                  Patient
                </th>
                <th scope="col" className="p-2 text-right">
                  Dose
                </th>
                <th scope="col" className="p-2 text-right">
                  Volume
                </th>
                <th scope="col" className="p-2">
                  Drawn from
                </th>
              </tr>
            </thead>
            <tbody>
              {p.steps.map((s) => (
                <tr key={s.orderId} className="border-b border-paper-200">
                  <td className="numerals-steady p-2 font-semibold">{at(s.readyBy)}</td>
                  <td className="p-2">
                    {s.label} <span className="text-sm text-paper-700">· order {s.orderId}</span>
                  </td>
                  <td className="numerals-steady p-2 text-right">{mg(s.doseMg)}</td>
                  <td className="numerals-steady p-2 text-right">{s.drugVolumeMl} mL</td>
                  <td className="p-2">
                    {s.vials.length === 1 ? 'Vial' : 'Vials'} {s.vials.join(' and ')}
                    {s.fromSharedVial && (
                      <span className="ml-2 rounded bg-iris-50 px-1.5 text-sm text-iris-900">
                        shared, already open
                      </span>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <table className="w-full border-collapse bg-white text-left">
            <caption className="mb-2 text-left text-lg font-semibold text-paper-900">Vials</caption>
            <thead>
              <tr className="border-b border-paper-300 text-sm text-paper-700">
                <th scope="col" className="p-2">
                  Vial
                </th>
                <th scope="col" className="p-2">
                  Reconstitute between
                </th>
                <th scope="col" className="p-2">
                  Serves orders
                </th>
                <th scope="col" className="p-2 text-right">
                  Drawn
                </th>
                <th scope="col" className="p-2 text-right">
                  Left and discarded
                </th>
              </tr>
            </thead>
            <tbody>
              {p.vials.map((v) => (
                <tr key={v.number} className="border-b border-paper-200">
                  <th scope="row" className="p-2">
                    {v.number}
                  </th>
                  <td className="numerals-steady p-2">
                    {at(v.reconstituteNotBefore)} and {at(v.reconstituteBy)}
                  </td>
                  <td className="p-2">{v.orderIds.join(', ')}</td>
                  <td className="numerals-steady p-2 text-right">{v.drawnMl} mL</td>
                  <td className="numerals-steady p-2 text-right">{mg(v.leftOverMg)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </>
      )}
    </div>
  );
}
