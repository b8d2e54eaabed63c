// One server-clock estimate for the whole client: src/lib/server-clock.ts.
export * from '../../../lib/server-clock';
