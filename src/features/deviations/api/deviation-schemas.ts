// The deviation API's shapes: src/lib/queries/deviation-schemas.ts (the one deviation cache's).
export * from '../../../lib/queries/deviation-schemas';
