import multer from 'multer';
import { AppError } from '../http/app-error';
import type { RouteSpec } from '../http/route-table';
import { idParam, parseInput } from '../http/validation';
import { actorOf } from '../orders/routes';
import { attachmentMaxBytes, type AttachmentService } from './service';

const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: attachmentMaxBytes, files: 1 } }).single('file');

export function attachmentRoutes(attachments: AttachmentService): RouteSpec[] {
  return [
    {
      method: 'post',
      path: '/orders/:id/attachments',
      access: 'orders.write',
      before: [upload],
      handler: async (req, res) => {
        const id = parseInput(idParam, req.params.id, 'id');
        if (!req.file) throw AppError.badRequest('Attach the report as the form field "file".', [{ path: 'file', message: 'file is required (PDF, PNG or JPEG, up to 10 MB)' }]);
        res.status(201).json({ attachment: await attachments.add(actorOf(req, res), id, req.file) });
      },
    },
    {
      method: 'get',
      path: '/attachments/:id',
      access: 'signed-in',
      handler: async (req, res) => {
        const { row, content } = await attachments.read(parseInput(idParam, req.params.id, 'id'));
        res.set({
          'Content-Type': row.mimeType,
          'Content-Length': String(content.length),
          'Content-Disposition': `attachment; filename="${row.fileName.replace(/"/g, '')}"`,
          'Cache-Control': 'private, no-store',
        });
        res.end(content);
      },
    },
  ];
}
