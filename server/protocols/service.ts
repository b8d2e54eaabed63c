import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import {
  protocolFileName,
  protocolVersionSchema,
  type ProtocolVersion as ProtocolDefinition,
} from '../../shared/protocol/protocol-schema';
import type { Role } from '../../shared/roles';
import type { Clock } from '../clock';
import type { AuditRepository } from '../audit/repository';
import type { ProtocolVersion } from '../db/entities/protocol-version';
import { AppError } from '../http/app-error';
import { fieldProblemsFromZod } from '../http/validation';
import type { protocolApprovalMeaning } from '../../shared/protocol/approval-signature';
import type { ProtocolForUse, ProtocolRepository } from './repository';

import { definitionSha256 } from './definition-hash';

export { definitionSha256 };

/** Roles whose holders may approve a protocol version; two different people are needed. */
const approvingRoles: Role[] = ['clinician', 'pharmacist'];
export const approvalsNeeded = 2;

export interface Actor {
  id: number;
  roles: Role[];
  ipAddress?: string | null;
}

/**
 * Superseded is derived, never stored: an approved version is superseded while a newer version
 * of the same protocol is approved. Stored, it would need a second row written at each approval
 * and undone when the newer version is retired; derived, it is right whatever happens later.
 */
export function toVersionSummary(row: ProtocolVersion, newestApproved: number | null = null) {
  const supersededBy =
    row.status === 'approved' && newestApproved !== null && newestApproved > row.version
      ? newestApproved
      : null;
  return {
    key: row.key,
    version: row.version,
    kind: row.kind,
    title: row.title,
    status: row.status,
    origin: row.origin,
    sha256: row.sha256,
    createdAt: row.createdAt.toISOString(),
    approvedAt: row.approvedAt?.toISOString() ?? null,
    retiredAt: row.retiredAt?.toISOString() ?? null,
    discardedAt: row.discardedAt?.toISOString() ?? null,
    discardReason: row.discardReason,
    supersededBy,
    approvals: (row.approvals ?? [])
      .filter((a) => a.definitionSha256 === row.sha256)
      .map((a) => ({
        userId: a.userId,
        displayName: a.user?.displayName ?? null,
        approvedAs: a.approvedAs,
        approvedAt: a.approvedAt.toISOString(),
        meaning: a.meaning,
      })),
  };
}

export function toVersionDetail(row: ProtocolVersion, newestApproved: number | null = null) {
  return {
    ...toVersionSummary(row, newestApproved),
    sourceFile: row.sourceFile,
    definition: row.definition,
  };
}

/** The newest approved version number of each protocol key. */
function newestApprovedByKey(rows: ProtocolVersion[]): Map<string, number> {
  const newest = new Map<string, number>();
  for (const row of rows) {
    if (row.status === 'approved' && row.version > (newest.get(row.key) ?? 0))
      newest.set(row.key, row.version);
  }
  return newest;
}

/** Validates a definition; failures become a 400 whose fields carry the JSON path. */
export function parseDefinition(input: unknown, prefix: string): ProtocolDefinition {
  const parsed = protocolVersionSchema.safeParse(input);
  if (parsed.success) return parsed.data;
  const fields = fieldProblemsFromZod(parsed.error, prefix);
  throw AppError.badRequest(
    `The protocol version is not valid: ${fields
      .slice(0, 5)
      .map((f) => `${f.path}: ${f.message}`)
      .join('; ')}`,
    fields,
  );
}

export class ProtocolFileError extends Error {}

/** Checks a person's own password, throttled like a sign-in (server/auth/service.ts). */
export type ConfirmSignature = (
  userId: number,
  password: string,
  ipAddress: string | undefined,
) => Promise<boolean>;

export function createProtocolService(
  repo: ProtocolRepository,
  audit: AuditRepository,
  confirmSignature: ConfirmSignature,
  clock: Clock,
) {
  async function mustFind(key: string, version: number): Promise<ProtocolVersion> {
    const row = await repo.find(key, version);
    if (!row) throw AppError.notFound(`There is no protocol ${key} version ${version}.`);
    return row;
  }

  /** The version an order uses: the one named, or the newest approved. */
  async function resolveForUse(key: string, version?: number): Promise<ProtocolForUse> {
    const row = await repo.findForUse(key, version);
    if (row) return row;
    throw AppError.notFound(
      version === undefined
        ? `There is no approved version of protocol ${key}.`
        : `There is no protocol ${key} version ${version}.`,
    );
  }

  return {
    /**
     * Stores every shipped file as an approved version of the demo unit. A stored version whose
     * content differs from its file stops the start: approved versions never change.
     */
    async loadShippedFiles(directory: string): Promise<{ added: string[]; unchanged: number }> {
      const files = readdirSync(directory)
        .filter((f) => f.endsWith('.json'))
        .sort();
      const added: string[] = [];
      let unchanged = 0;
      for (const file of files) {
        const where = path.join(path.basename(directory), file);
        let json: unknown;
        try {
          json = JSON.parse(readFileSync(path.join(directory, file), 'utf8'));
        } catch (error) {
          throw new ProtocolFileError(`${where} is not valid JSON: ${(error as Error).message}`);
        }
        const parsed = protocolVersionSchema.safeParse(json);
        if (!parsed.success) {
          const lines = fieldProblemsFromZod(parsed.error).map((f) => `  ${f.path}: ${f.message}`);
          throw new ProtocolFileError(
            `${where} is not a valid protocol version:\n${lines.join('\n')}`,
          );
        }
        const definition = parsed.data;
        if (protocolFileName(definition) !== file) {
          throw new ProtocolFileError(
            `${where} holds ${definition.key} version ${definition.version}; its name must be ${protocolFileName(definition)}`,
          );
        }
        if (!definition.approval) {
          throw new ProtocolFileError(
            `${where} has no approval block; a shipped version records its approvers and date`,
          );
        }
        const sha256 = definitionSha256(definition);
        const stored = await repo.find(definition.key, definition.version);
        if (stored) {
          if (stored.sha256 !== sha256) {
            throw new ProtocolFileError(
              `${where} differs from the ${definition.key} version ${definition.version} already stored (stored SHA-256 ${stored.sha256.slice(0, 12)}…, file ${sha256.slice(0, 12)}…). ` +
                `An approved protocol version never changes: restore the file and add the change as version ${definition.version + 1}.`,
            );
          }
          unchanged++;
          continue;
        }
        const row = await repo.insert({
          key: definition.key,
          version: definition.version,
          kind: definition.kind,
          title: definition.title,
          status: 'approved',
          origin: 'shipped',
          definition,
          sha256,
          sourceFile: where,
          createdBy: null,
          approvedAt: new Date(`${definition.approval.approvedOn}T00:00:00Z`),
          retiredAt: null,
          retiredBy: null,
        });
        await audit.append({
          actorUserId: null,
          action: 'protocol.loaded',
          entityType: 'protocol_version',
          entityId: row.id,
          details: {
            key: row.key,
            version: row.version,
            sha256,
            file: where,
            approvedBy: definition.approval.approvedBy,
          },
        });
        added.push(`${row.key} v${row.version}`);
      }
      return { added, unchanged };
    },

    async list() {
      const rows = await repo.listAll();
      const newest = newestApprovedByKey(rows);
      const byKey = new Map<string, ReturnType<typeof toVersionSummary>[]>();
      for (const row of rows)
        byKey.set(row.key, [
          ...(byKey.get(row.key) ?? []),
          toVersionSummary(row, newest.get(row.key) ?? null),
        ]);
      return [...byKey.entries()].map(([key, versions]) => ({
        key,
        kind: versions[0]!.kind,
        title: versions.at(-1)!.title,
        versions,
      }));
    },

    async get(key: string, version: number) {
      const row = await mustFind(key, version);
      return toVersionDetail(row, (await repo.latestApproved(key))?.version ?? null);
    },

    /** The newer approved version that supersedes this one, or null when it is the newest. */
    async supersededBy(key: string, version: number): Promise<number | null> {
      const newest = (await repo.latestApproved(key))?.version ?? null;
      return newest !== null && newest > version ? newest : null;
    },

    resolveForUse,

    async importVersion(actor: Actor, json: unknown, fileName: string) {
      if (
        json &&
        typeof json === 'object' &&
        'approval' in json &&
        (json as { approval: unknown }).approval != null
      ) {
        throw AppError.badRequest(
          'An imported version must not carry an approval block: it is approved here, by two people.',
          [{ path: 'approval', message: 'approval must be null in an imported version' }],
        );
      }
      const definition = parseDefinition(json, '');
      if (await repo.find(definition.key, definition.version)) {
        throw AppError.conflict(
          'version_exists',
          `Protocol ${definition.key} version ${definition.version} exists already; a change needs a new version number.`,
        );
      }
      return this.storeDraft(actor, definition, 'imported', fileName);
    },

    async createDraftFrom(actor: Actor, from: { key: string; version: number }) {
      const source = await mustFind(from.key, from.version);
      const version = (await repo.highestVersion(from.key)) + 1;
      const definition = parseDefinition({ ...source.definition, version, approval: null }, '');
      return this.storeDraft(actor, definition, 'cloned', null, {
        clonedFrom: `${from.key} v${from.version}`,
      });
    },

    async storeDraft(
      actor: Actor,
      definition: ProtocolDefinition,
      origin: 'imported' | 'cloned',
      fileName: string | null,
      extra: Record<string, unknown> = {},
    ) {
      const sha256 = definitionSha256(definition);
      let row: ProtocolVersion;
      try {
        row = await repo.insert({
          key: definition.key,
          version: definition.version,
          kind: definition.kind,
          title: definition.title,
          status: 'draft',
          origin,
          definition,
          sha256,
          sourceFile: fileName,
          createdBy: actor.id,
          approvedAt: null,
          retiredAt: null,
          retiredBy: null,
        });
      } catch (error) {
        if ((error as { code?: string }).code === 'ER_DUP_ENTRY') {
          throw AppError.conflict(
            'version_exists',
            `Protocol ${definition.key} version ${definition.version} exists already.`,
          );
        }
        throw error;
      }
      await audit.append({
        actorUserId: actor.id,
        action: origin === 'imported' ? 'protocol.imported' : 'protocol.draft-created',
        entityType: 'protocol_version',
        entityId: row.id,
        ipAddress: actor.ipAddress,
        details: {
          key: row.key,
          version: row.version,
          sha256,
          ...(fileName ? { file: fileName } : {}),
          ...extra,
        },
      });
      return this.get(row.key, row.version);
    },

    async updateDraft(actor: Actor, key: string, version: number, input: unknown) {
      const row = await mustFind(key, version);
      if (row.status !== 'draft')
        throw AppError.conflict(
          'not_a_draft',
          `Protocol ${key} version ${version} is ${row.status}; only a draft can be edited.`,
        );
      const definition = parseDefinition(input, 'definition');
      if (definition.key !== key || definition.version !== version) {
        throw AppError.badRequest('A draft keeps its key and version.', [
          { path: 'definition.key', message: `key and version must stay ${key} and ${version}` },
        ]);
      }
      if (definition.approval) {
        throw AppError.badRequest('A draft carries no approval block.', [
          { path: 'definition.approval', message: 'approval must be null in a draft' },
        ]);
      }
      const sha256 = definitionSha256(definition);
      await repo.updateDraft(row.id, { definition, sha256, title: definition.title });
      await audit.append({
        actorUserId: actor.id,
        action: 'protocol.draft-edited',
        entityType: 'protocol_version',
        entityId: row.id,
        ipAddress: actor.ipAddress,
        details: { key, version, sha256, previousSha256: row.sha256 },
      });
      return this.get(key, version);
    },

    /**
     * An approval is an electronic signature: the approver's own password, checked and throttled
     * as at sign-in, and the meaning they were shown, stored with it. A wrong password records
     * nothing but the refusal in the audit trail.
     */
    async approve(
      actor: Actor,
      key: string,
      version: number,
      signature: { password: string; meaning: typeof protocolApprovalMeaning },
    ) {
      const found = await mustFind(key, version);
      const approvedAs = approvingRoles.find((role) => actor.roles.includes(role));
      if (!approvedAs)
        throw AppError.forbidden(
          'Only a clinician or a pharmacist can approve a protocol version.',
        );
      if (!(await confirmSignature(actor.id, signature.password, actor.ipAddress ?? undefined))) {
        await audit.append({
          actorUserId: actor.id,
          action: 'protocol.approval-refused',
          entityType: 'protocol_version',
          entityId: found.id,
          ipAddress: actor.ipAddress,
          details: { key, version, reason: 'wrong-password' },
        });
        throw AppError.badRequest('The password is not right; the version was not approved.', [
          { path: 'password', message: 'password must be your sign-in password' },
        ]);
      }
      const outcome = await repo.withLockedVersion(found.id, async (manager, row) => {
        if (row.status !== 'draft')
          throw AppError.conflict(
            'not_a_draft',
            `Protocol ${key} version ${version} is already ${row.status}.`,
          );
        const current = (await repo.approvalsOf(manager, row.id)).filter(
          (a) => a.definitionSha256 === row.sha256,
        );
        if (current.some((a) => a.userId === actor.id)) {
          throw AppError.conflict(
            'already_approved',
            'You have approved this version already; a second, different person must approve it.',
          );
        }
        await repo.addApproval(manager, {
          protocolVersionId: row.id,
          userId: actor.id,
          approvedAs,
          meaning: signature.meaning,
          definitionSha256: row.sha256,
        });
        const becomesApproved = current.length + 1 >= approvalsNeeded;
        if (becomesApproved)
          await repo.setStatus(manager, row.id, { status: 'approved', approvedAt: clock.now() });
        return { id: row.id, sha256: row.sha256, becomesApproved, approvals: current.length + 1 };
      });
      // Audited after the commit: a transaction must not wait for a second pooled connection.
      await audit.append({
        actorUserId: actor.id,
        action: outcome.becomesApproved ? 'protocol.approved' : 'protocol.approval-given',
        entityType: 'protocol_version',
        entityId: outcome.id,
        ipAddress: actor.ipAddress,
        details: {
          key,
          version,
          sha256: outcome.sha256,
          approvedAs,
          meaning: signature.meaning,
          approvals: outcome.approvals,
        },
      });
      return this.get(key, version);
    },

    async retire(actor: Actor, key: string, version: number, reason: string) {
      const found = await mustFind(key, version);
      await repo.withLockedVersion(found.id, async (manager, row) => {
        if (row.status !== 'approved')
          throw AppError.conflict(
            'not_approved',
            `Only an approved version can be retired; ${key} version ${version} is ${row.status}.`,
          );
        await repo.setStatus(manager, row.id, {
          status: 'retired',
          retiredAt: clock.now(),
          retiredBy: actor.id,
        });
      });
      await audit.append({
        actorUserId: actor.id,
        action: 'protocol.retired',
        entityType: 'protocol_version',
        entityId: found.id,
        ipAddress: actor.ipAddress,
        details: { key, version, reason },
      });
      return this.get(key, version);
    },

    /**
     * Sets an unapproved draft aside, with a reason; it stays on record (its number is not given
     * again) and can never be edited or approved. An approved or retired version is never discarded.
     */
    async discard(actor: Actor, key: string, version: number, reason: string) {
      const found = await mustFind(key, version);
      await repo.withLockedVersion(found.id, async (manager, row) => {
        if (row.status !== 'draft')
          throw AppError.conflict(
            'not_a_draft',
            `Only an unapproved draft can be discarded; ${key} version ${version} is ${row.status}.`,
          );
        await repo.setStatus(manager, row.id, {
          status: 'discarded',
          discardedAt: clock.now(),
          discardedBy: actor.id,
          discardReason: reason,
        });
      });
      await audit.append({
        actorUserId: actor.id,
        action: 'protocol.draft-discarded',
        entityType: 'protocol_version',
        entityId: found.id,
        ipAddress: actor.ipAddress,
        details: { key, version, sha256: found.sha256, reason },
      });
      return this.get(key, version);
    },
  };
}

export type ProtocolService = ReturnType<typeof createProtocolService>;
