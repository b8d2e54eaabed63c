/**
 * Every route in the client. Screens link with `getHref(...)`; the router matches on `path`.
 * Nothing else in the app writes a URL by hand.
 */
export const paths = {
  signIn: {
    path: '/sign-in',
    /** `redirectTo` is where the person was heading; they land there after signing in. */
    getHref: (redirectTo?: string | null) =>
      redirectTo && redirectTo !== '/'
        ? `/sign-in?redirectTo=${encodeURIComponent(redirectTo)}`
        : '/sign-in',
  },
  /** Public: the page a one-time link opens; the token follows in the fragment (`#…`). */
  setPassword: {
    path: '/set-password',
    getHref: () => '/set-password',
  },
  changePassword: {
    path: '/account/password',
    getHref: () => '/account/password',
  },
  lists: {
    path: '/lists',
    getHref: () => '/lists',
  },
  vialPlan: {
    path: '/lists/:id/vial-plan',
    getHref: (id: number | string) => `/lists/${encodeURIComponent(String(id))}/vial-plan`,
  },
  stock: {
    path: '/stock',
    getHref: () => '/stock',
  },
  recall: {
    path: '/recall',
    getHref: (lot?: string) => (lot ? `/recall?lot=${encodeURIComponent(lot)}` : '/recall'),
  },
  drugUse: {
    path: '/reports/drug-use',
    getHref: () => '/reports/drug-use',
  },
  today: {
    path: '/',
    getHref: () => '/',
  },
  people: {
    path: '/people',
    getHref: () => '/people',
  },
  protocols: {
    path: '/protocols',
    getHref: () => '/protocols',
  },
  protocolVersion: {
    path: '/protocols/:key/v/:version',
    getHref: (key: string, version: number | string) =>
      `/protocols/${encodeURIComponent(key)}/v/${encodeURIComponent(String(version))}`,
  },
  protocolCompare: {
    path: '/protocols/:key/compare/:from/:to',
    /** `from` is read as the earlier version (before), `to` as the later (after). */
    getHref: (key: string, from: number | string, to: number | string) =>
      `/protocols/${encodeURIComponent(key)}/compare/${encodeURIComponent(String(from))}/${encodeURIComponent(String(to))}`,
  },
  patients: {
    path: '/patients',
    /** `q` is the search text, kept in the address so a search can be reloaded or shared. */
    getHref: (q?: string) => (q ? `/patients?q=${encodeURIComponent(q)}` : '/patients'),
  },
  patient: {
    path: '/patients/:id',
    getHref: (id: number | string) => `/patients/${encodeURIComponent(String(id))}`,
  },
  orders: {
    path: '/orders',
    /** `search` is the table's filter, sort and page state as URL search parameters. */
    getHref: (search?: string) => (search ? `/orders?${search}` : '/orders'),
  },
  newOrder: {
    path: '/orders/new',
    getHref: (patientId?: number | string) =>
      patientId !== undefined
        ? `/orders/new?patientId=${encodeURIComponent(String(patientId))}`
        : '/orders/new',
  },
  order: {
    path: '/orders/:id',
    getHref: (id: number | string) => `/orders/${encodeURIComponent(String(id))}`,
  },
  orderEdit: {
    path: '/orders/:id/edit',
    getHref: (id: number | string) => `/orders/${encodeURIComponent(String(id))}/edit`,
  },
  orderAmend: {
    path: '/orders/:id/amend',
    getHref: (id: number | string) => `/orders/${encodeURIComponent(String(id))}/amend`,
  },
  orderDischarge: {
    path: '/orders/:id/discharge',
    /** The printable discharge sheet of one order's session (and the e-mail to the patient). */
    getHref: (id: number | string) => `/orders/${encodeURIComponent(String(id))}/discharge`,
  },
  orderCancelling: {
    path: '/order-cancelling',
    /** The administrator's list of orders that may still be cancelled (identity only). */
    getHref: () => '/order-cancelling',
  },
  lightCalculator: {
    path: '/light-calculator',
    getHref: () => '/light-calculator',
  },
  doseChecks: {
    path: '/dose-checks',
    getHref: () => '/dose-checks',
  },
  doseCheck: {
    path: '/dose-checks/:orderId',
    getHref: (orderId: number | string) => `/dose-checks/${encodeURIComponent(String(orderId))}`,
  },
  outbox: {
    path: '/outbox',
    getHref: () => '/outbox',
  },
  stepClock: {
    path: '/sessions/:orderId',
    /** The bedside step clock of one order: pre-treatment checks, then the timed steps. */
    getHref: (orderId: number | string) => `/sessions/${encodeURIComponent(String(orderId))}`,
  },
  deviations: {
    path: '/deviations',
    /** `search` is the queue's filter, sort and page as URL search parameters. */
    getHref: (search?: string) => (search ? `/deviations?${search}` : '/deviations'),
  },
  deviation: {
    path: '/deviations/:id',
    getHref: (id: number | string) => `/deviations/${encodeURIComponent(String(id))}`,
  },
  doseRecords: {
    path: '/dose-records',
    getHref: (search?: string) => (search ? `/dose-records?${search}` : '/dose-records'),
  },
  doseRecordPrint: {
    path: '/dose-records/:orderId/print',
    /** One order's dose record laid out for printing and filing in the chart. */
    getHref: (orderId: number | string) =>
      `/dose-records/${encodeURIComponent(String(orderId))}/print`,
  },
  trends: {
    path: '/trends',
    getHref: (search?: string) => (search ? `/trends?${search}` : '/trends'),
  },
  devices: {
    path: '/devices',
    getHref: () => '/devices',
  },
  device: {
    path: '/devices/:deviceId',
    getHref: (deviceId: number | string) => `/devices/${encodeURIComponent(String(deviceId))}`,
  },
  outcomes: {
    path: '/outcomes',
    getHref: (search?: string) => (search ? `/outcomes?${search}` : '/outcomes'),
  },
  auditTrail: {
    path: '/audit-trail',
    getHref: (search?: string) => (search ? `/audit-trail?${search}` : '/audit-trail'),
  },
} as const;
