import multer from 'multer';
import { z } from 'zod';
import { signedInUser } from '../auth/sign-in-session';
import { AppError } from '../http/app-error';
import type { RouteSpec } from '../http/route-table';
import { parseInput } from '../http/validation';
import { protocolApprovalMeaning } from '../../shared/protocol/approval-signature';
import type { Actor, ProtocolService } from './service';

const versionParams = z.object({
  key: z
    .string()
    .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'key must be a kebab-case protocol key')
    .max(64, 'key must be at most 64 characters'),
  version: z.coerce
    .number({ error: 'version must be a whole number' })
    .int('version must be a whole number')
    .min(1, 'version must be 1 or more')
    .max(100000, 'version must be at most 100000'),
});

const draftRequest = z.object({ from: versionParams }).strict();
const retireRequest = z
  .object({
    reason: z
      .string({ error: 'reason is required' })
      .trim()
      .min(5, 'reason must be 5 to 500 characters')
      .max(500, 'reason must be 5 to 500 characters'),
  })
  .strict();
const discardRequest = retireRequest;
const approveRequest = z
  .object({
    password: z
      .string({ error: 'password is required' })
      .min(1, 'password is required')
      .max(200, 'password must be at most 200 characters'),
    meaning: z.literal(protocolApprovalMeaning, {
      error: `meaning must be "${protocolApprovalMeaning}"`,
    }),
  })
  .strict();
const updateDraftRequest = z.object({ definition: z.unknown() }).strict();

// Protocol files are small JSON documents; a megabyte is generous.
const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: 1024 * 1024, files: 1 },
}).single('file');

export function protocolRoutes(protocols: ProtocolService): RouteSpec[] {
  const actor = (req: { ip?: string }, res: Parameters<typeof signedInUser>[0]): Actor => {
    const user = signedInUser(res);
    return { id: user.id, roles: user.roles, ipAddress: req.ip };
  };
  return [
    {
      method: 'get',
      path: '/protocols',
      access: 'protocols.read',
      handler: async (_req, res) => {
        res.json({ protocols: await protocols.list() });
      },
    },
    {
      method: 'get',
      path: '/protocols/:key/versions/:version',
      access: 'protocols.read',
      handler: async (req, res) => {
        const { key, version } = parseInput(versionParams, req.params);
        res.json({ version: await protocols.get(key, version) });
      },
    },
    {
      method: 'post',
      path: '/protocols/imports',
      access: 'protocols.import',
      before: [upload],
      handler: async (req, res) => {
        const file = req.file;
        if (!file)
          throw AppError.badRequest('Attach a protocol file as the form field "file".', [
            { path: 'file', message: 'file is required (a JSON protocol version)' },
          ]);
        let json: unknown;
        try {
          // Checked by content, not by name: it must parse as JSON.
          json = JSON.parse(file.buffer.toString('utf8'));
        } catch {
          throw AppError.badRequest('The file is not JSON.', [
            { path: 'file', message: 'file must be a JSON protocol version' },
          ]);
        }
        res.status(201).json({
          version: await protocols.importVersion(
            actor(req, res),
            json,
            file.originalname.slice(0, 200),
          ),
        });
      },
    },
    {
      method: 'post',
      path: '/protocols/drafts',
      access: 'protocols.import',
      handler: async (req, res) => {
        const { from } = parseInput(draftRequest, req.body);
        res.status(201).json({ version: await protocols.createDraftFrom(actor(req, res), from) });
      },
    },
    {
      method: 'put',
      path: '/protocols/:key/versions/:version',
      access: 'protocols.import',
      handler: async (req, res) => {
        const { key, version } = parseInput(versionParams, req.params);
        const { definition } = parseInput(updateDraftRequest, req.body);
        res.json({
          version: await protocols.updateDraft(actor(req, res), key, version, definition),
        });
      },
    },
    {
      method: 'post',
      path: '/protocols/:key/versions/:version/approvals',
      access: 'protocols.approve',
      handler: async (req, res) => {
        const { key, version } = parseInput(versionParams, req.params);
        const signature = parseInput(approveRequest, req.body);
        res
          .status(201)
          .json({ version: await protocols.approve(actor(req, res), key, version, signature) });
      },
    },
    {
      method: 'post',
      path: '/protocols/:key/versions/:version/retirement',
      access: 'protocols.retire',
      handler: async (req, res) => {
        const { key, version } = parseInput(versionParams, req.params);
        const { reason } = parseInput(retireRequest, req.body);
        res.json({ version: await protocols.retire(actor(req, res), key, version, reason) });
      },
    },
    {
      method: 'post',
      path: '/protocols/:key/versions/:version/discard',
      access: 'protocols.import',
      handler: async (req, res) => {
        const { key, version } = parseInput(versionParams, req.params);
        const { reason } = parseInput(discardRequest, req.body);
        res.json({ version: await protocols.discard(actor(req, res), key, version, reason) });
      },
    },
  ];
}
