import multer from 'multer';
import { AppError } from '../http/app-error';
import type { RouteSpec } from '../http/route-table';
import { idParam, parseInput } from '../http/validation';
import { actorOf } from '../orders/routes';
import { attachmentMaxBytes, type AttachmentService } from './service';

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: attachmentMaxBytes, files: 1 },
}).single('file');

export function attachmentRoutes(attachments: AttachmentService): RouteSpec[] {
  return [
    {
      method: 'post',
      path: '/orders/:id/attachments',
      access: 'orders.write',
      before: [upload],
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        if (!req.file)
          throw AppError.badRequest('Attach the report as the form field "file".', [
            { path: 'file', message: 'file is required (PDF, PNG or JPEG, up to 10 MB)' },
          ]);
        res
          .status(201)
          .json({ attachment: await attachments.add(actorOf(req, res), id, req.file) });
      },
    },
    {
      method: 'get',
      path: '/attachments/:id',
      // Whoever may read orders may read their reports; nobody else (see permissions.ts).
      access: 'orders.read',
      handler: async (req, res) => {
        const { row, content, downloadName } = await attachments.read(
          parseInput(idParam, req.params.id, 'id'),
          actorOf(req, res),
        );
        const asciiName = downloadName.replace(/[^\w.\- ()]/g, '_');
        res.set({
          // The type it was checked as on upload, never a type the browser guesses or renders as a page.
          'Content-Type': row.mimeType,
          'X-Content-Type-Options': 'nosniff',
          'Content-Security-Policy': "default-src 'none'; sandbox",
          'Content-Length': String(content.length),
          'Content-Disposition': `attachment; filename="${asciiName}"; filename*=UTF-8''${encodeURIComponent(downloadName)}`,
          'Cache-Control': 'private, no-store',
        });
        res.end(content);
      },
    },
  ];
}
