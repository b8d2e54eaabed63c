// The session's shape is shared by every screen that shows a session: src/lib/queries/session-schema.ts.
export * from '../../../lib/queries/session-schema';
