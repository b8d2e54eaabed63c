import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { stockProducts, type StockLot } from '../../../../shared/schemas/stock';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { AlertIcon, ClockIcon } from '../../../components/ui/icons';
import { PageHeader } from '../../../components/ui/page-header';
import { SelectField } from '../../../components/ui/select-field';
import { LoadingPanel } from '../../../components/ui/status-panel';
import { TextField } from '../../../components/ui/text-field';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { adjustStock, receiveStock, stockKeys, stockLotsQuery } from '../../../lib/queries/stock';

const fieldError = (error: unknown, path: string) =>
  isApiRequestError(error) ? error.fields.find((f) => f.path === path)?.message : undefined;

/** The pharmacy's stock: receive a lot, what is on hand, what expires within 30 days, and a count adjusted. */
export function StockScreen({ canManage }: { canManage: boolean }) {
  const lots = useQuery(stockLotsQuery());
  const all = lots.data?.lots ?? [];
  const expiring = all.filter((l) => l.expiresWithin30Days && l.quantityOnHand > 0);
  return (
    <div className="space-y-6">
      <PageHeader
        title="Stock"
        lead="Vials and solutions by generic name and lot. A preparation takes its vials from the lot that expires first unless the pharmacist picks another; expired or empty lots are never issued."
      />
      {canManage && <ReceiveForm />}
      {lots.isPending ? (
        <LoadingPanel label="Loading the stock…" />
      ) : lots.isError ? (
        <Alert tone="error" title="The stock could not be loaded">
          {describeError(lots.error)}
        </Alert>
      ) : (
        <>
          <section aria-labelledby="expiring-heading" className="space-y-2">
            <h2 id="expiring-heading" className="text-lg font-semibold text-paper-900">
              Expiring within 30 days
            </h2>
            {expiring.length === 0 ? (
              <p className="text-paper-700">No lot on hand expires within 30 days.</p>
            ) : (
              <ul className="space-y-1">
                {expiring.map((l) => (
                  <li key={l.id} className="flex items-center gap-2 text-paper-900">
                    <ClockIcon className="size-4" />
                    {l.product}, lot {l.lot}: {l.quantityOnHand} {l.unit}
                    {l.quantityOnHand === 1 ? '' : 's'} expire on {l.expiry}
                  </li>
                ))}
              </ul>
            )}
          </section>
          <LotTable lots={all} canManage={canManage} />
        </>
      )}
    </div>
  );
}

type ReceiveValues = { product: string; lot: string; expiry: string; quantity: number };

function ReceiveForm() {
  const queryClient = useQueryClient();
  const form = useForm<ReceiveValues>({
    defaultValues: { product: 'verteporfin', lot: '', expiry: '', quantity: 1 },
  });
  const receive = useMutation({
    mutationFn: (values: ReceiveValues) => receiveStock(values),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: stockKeys.all() });
      form.reset({ ...form.getValues(), lot: '', expiry: '', quantity: 1 });
    },
  });
  return (
    <form
      aria-labelledby="receive-heading"
      className="space-y-4 rounded-2xl border border-paper-200 bg-white p-5"
      onSubmit={form.handleSubmit((v) => receive.mutate(v))}
    >
      <h2 id="receive-heading" className="text-lg font-semibold text-paper-950">
        Receive stock
      </h2>
      <div className="grid gap-4 sm:grid-cols-4">
        <SelectField
          label="Product (generic name)"
          error={fieldError(receive.error, 'product')}
          {...form.register('product')}
        >
          {stockProducts.map((p) => (
            <option key={p} value={p}>
              {p}
            </option>
          ))}
        </SelectField>
        <TextField
          label="Lot"
          required
          error={fieldError(receive.error, 'lot')}
          {...form.register('lot')}
        />
        <TextField
          label="Expiry"
          type="date"
          required
          error={fieldError(receive.error, 'expiry')}
          {...form.register('expiry')}
        />
        <TextField
          label="Quantity"
          type="number"
          inputMode="numeric"
          min={1}
          error={fieldError(receive.error, 'quantity')}
          {...form.register('quantity', { valueAsNumber: true })}
        />
      </div>
      {receive.isError && <Alert tone="error">{describeError(receive.error)}</Alert>}
      {receive.isSuccess && (
        <Alert tone="info">
          Received: lot {receive.data.lot.lot}, now {receive.data.lot.quantityOnHand} on hand.
        </Alert>
      )}
      <Button type="submit" busy={receive.isPending}>
        Receive
      </Button>
    </form>
  );
}

function LotTable({ lots, canManage }: { lots: StockLot[]; canManage: boolean }) {
  const [adjusting, setAdjusting] = useState<number | null>(null);
  return (
    <section aria-labelledby="on-hand-heading" className="space-y-2">
      <h2 id="on-hand-heading" className="text-lg font-semibold text-paper-900">
        On hand
      </h2>
      <table className="w-full border-collapse bg-white text-left">
        <thead>
          <tr className="border-b border-paper-300 text-sm text-paper-700">
            <th scope="col" className="p-2">
              Product
            </th>
            <th scope="col" className="p-2">
              Lot
            </th>
            <th scope="col" className="p-2">
              Expiry
            </th>
            <th scope="col" className="p-2 text-right">
              On hand
            </th>
            <th scope="col" className="p-2 text-right">
              Received
            </th>
            {canManage && (
              <th scope="col" className="p-2">
                Count
              </th>
            )}
          </tr>
        </thead>
        <tbody>
          {lots.map((l) => (
            <tr key={l.id} className="border-b border-paper-200 align-top">
              <td className="p-2">{l.product}</td>
              <th scope="row" className="p-2 font-semibold">
                {l.lot}
              </th>
              <td className="p-2">
                {l.expiry}
                {l.expired && (
                  <span className="ml-2 inline-flex items-center gap-1 text-sm font-semibold text-alarm-700">
                    <AlertIcon className="size-4" /> expired, not issued
                  </span>
                )}
                {l.expiresWithin30Days && (
                  <span className="ml-2 inline-flex items-center gap-1 text-sm text-paper-800">
                    <ClockIcon className="size-4" /> within 30 days
                  </span>
                )}
              </td>
              <td className="numerals-steady p-2 text-right font-semibold">
                {l.quantityOnHand} {l.unit}
                {l.quantityOnHand === 1 ? '' : 's'}
              </td>
              <td className="numerals-steady p-2 text-right">{l.receivedQuantity}</td>
              {canManage && (
                <td className="p-2">
                  {adjusting === l.id ? (
                    <AdjustForm lot={l} onDone={() => setAdjusting(null)} />
                  ) : (
                    <Button variant="quiet" size="sm" onClick={() => setAdjusting(l.id)}>
                      Adjust count<span className="sr-only"> of lot {l.lot}</span>
                    </Button>
                  )}
                </td>
              )}
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}

type AdjustValues = { countedQuantity: number; reason: string };

function AdjustForm({ lot, onDone }: { lot: StockLot; onDone: () => void }) {
  const queryClient = useQueryClient();
  const form = useForm<AdjustValues>({
    defaultValues: { countedQuantity: lot.quantityOnHand, reason: '' },
  });
  const adjust = useMutation({
    mutationFn: (values: AdjustValues) => adjustStock(lot.id, values),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: stockKeys.all() });
      onDone();
    },
  });
  return (
    <form
      aria-label={`Adjust the count of lot ${lot.lot}`}
      className="space-y-2"
      onSubmit={form.handleSubmit((v) => adjust.mutate(v))}
    >
      <TextField
        label="Counted"
        type="number"
        inputMode="numeric"
        min={0}
        error={fieldError(adjust.error, 'countedQuantity')}
        {...form.register('countedQuantity', { valueAsNumber: true })}
      />
      <TextField
        label="Reason"
        hint="Kept in the audit trail with your name"
        error={fieldError(adjust.error, 'reason')}
        {...form.register('reason')}
      />
      {adjust.isError && !isApiRequestError(adjust.error) && (
        <Alert tone="error">{describeError(adjust.error)}</Alert>
      )}
      <div className="flex gap-2">
        <Button type="submit" size="sm" busy={adjust.isPending}>
          Save count
        </Button>
        <Button variant="secondary" size="sm" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
