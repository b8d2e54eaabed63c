import { z } from 'zod';

/** What the pharmacy keeps in stock, by generic name; the unit each is counted in. */
export const stockProducts = [
  'verteporfin',
  'riboflavin 0.1% with dextran',
  'riboflavin 0.1% hypo-osmolar',
] as const;
export type StockProduct = (typeof stockProducts)[number];
export const stockUnitOf: Record<StockProduct, string> = {
  verteporfin: 'vial',
  'riboflavin 0.1% with dextran': 'bottle',
  'riboflavin 0.1% hypo-osmolar': 'bottle',
};

export const lotText = (field: string) =>
  z
    .string({ error: `${field} is required` })
    .trim()
    .regex(
      /^[A-Za-z0-9][A-Za-z0-9 ./-]{1,39}$/,
      `${field} must be 2 to 40 letters, digits, spaces, dots, slashes or hyphens`,
    );

const reason = z
  .string({ error: 'reason is required' })
  .trim()
  .min(5, 'reason must be 5 to 500 characters')
  .max(500, 'reason must be 5 to 500 characters');

export const receiveStockSchema = z.strictObject({
  product: z.enum(stockProducts, { error: `product must be one of ${stockProducts.join(', ')}` }),
  lot: lotText('lot'),
  expiry: z.iso.date({ error: 'expiry must be a date (YYYY-MM-DD)' }),
  quantity: z
    .number({ error: 'quantity must be a whole number from 1 to 1000' })
    .int('quantity must be a whole number from 1 to 1000')
    .min(1, 'quantity must be a whole number from 1 to 1000')
    .max(1000, 'quantity must be a whole number from 1 to 1000'),
});
export type ReceiveStockEntry = z.infer<typeof receiveStockSchema>;

export const adjustStockSchema = z.strictObject({
  countedQuantity: z
    .number({ error: 'countedQuantity must be a whole number from 0 to 100000' })
    .int('countedQuantity must be a whole number from 0 to 100000')
    .min(0, 'countedQuantity must be a whole number from 0 to 100000')
    .max(100000, 'countedQuantity must be a whole number from 0 to 100000'),
  reason,
});
export type AdjustStockEntry = z.infer<typeof adjustStockSchema>;

export const recallQuerySchema = z.strictObject({ lot: lotText('lot') });

export const stockLotSchema = z.object({
  id: z.number(),
  product: z.string(),
  unit: z.string(),
  lot: z.string(),
  expiry: z.string(),
  quantityOnHand: z.number(),
  receivedQuantity: z.number(),
  expired: z.boolean(),
  expiresWithin30Days: z.boolean(),
});
export type StockLot = z.infer<typeof stockLotSchema>;

export const recallRowSchema = z.object({
  orderId: z.number(),
  patient: z.object({ id: z.number(), recordNumber: z.string(), name: z.string() }),
  eye: z.string(),
  date: z.string(),
  doseMg: z.number().nullable(),
  volumeDrawnMl: z.number(),
  status: z.string(),
  clinician: z.string().nullable(),
});
export type RecallRow = z.infer<typeof recallRowSchema>;
