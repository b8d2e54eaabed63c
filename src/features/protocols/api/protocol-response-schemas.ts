// The protocol API's shapes are read by every screen that shows a protocol: src/lib/queries/protocol-schemas.ts.
export * from '../../../lib/queries/protocol-schemas';
