/** MariaDB refused a row because a unique key holds that value already (errno 1062). */
export function isDuplicateKey(error: unknown): boolean {
  const e = error as { code?: string; driverError?: { code?: string } } | null;
  return e?.code === 'ER_DUP_ENTRY' || e?.driverError?.code === 'ER_DUP_ENTRY';
}
