import { createHash, randomUUID } from 'node:crypto';
import { chmod, mkdir, readFile, writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { AuditRepository } from '../audit/repository';
import type { Reader, ReadAudit } from '../audit/service';
import { AppError } from '../http/app-error';
import { detectFileType, extensionOf } from './file-type';
import type { AttachmentRepository } from './repository';

export const attachmentMaxBytes = 10 * 1024 * 1024;

/** A report checked by its content (PDF, PNG or JPEG), stored readable by the server only. */
export async function storeReport(
  uploadDir: string,
  file: { originalname: string; buffer: Buffer },
): Promise<{
  fileName: string;
  mimeType: string;
  sizeBytes: number;
  sha256: string;
  storageName: string;
}> {
  const type = detectFileType(file.buffer);
  if (!type) {
    throw new AppError(
      415,
      'unsupported_type',
      'Only PDF, PNG and JPEG reports can be attached; this file is none of them, whatever its name says.',
      [{ path: 'file', message: 'file must be a PDF, PNG or JPEG (checked by its content)' }],
    );
  }
  const sha256 = createHash('sha256').update(file.buffer).digest('hex');
  const storageName = `${randomUUID()}.${type.extension}`;
  // Health data: readable by the server's own user only, whatever the umask.
  await mkdir(uploadDir, { recursive: true, mode: 0o700 });
  const stored = path.join(uploadDir, storageName);
  await writeFile(stored, file.buffer, { flag: 'wx', mode: 0o600 });
  await chmod(stored, 0o600);
  const fileName =
    path
      .basename(file.originalname)
      .replace(/[^\w.\- ()]/g, '_')
      .slice(0, 200) || `report.${type.extension}`;
  return { fileName, mimeType: type.mimeType, sizeBytes: file.buffer.length, sha256, storageName };
}

export function createAttachmentService(
  attachments: AttachmentRepository,
  audit: AuditRepository,
  reads: ReadAudit,
  uploadDir: string,
) {
  return {
    async add(
      actor: { id: number; ipAddress?: string | null },
      orderId: number,
      file: { originalname: string; buffer: Buffer },
    ) {
      const status = await attachments.orderStatus(orderId);
      if (!status) throw AppError.notFound(`There is no order ${orderId}.`);
      if (status !== 'draft')
        throw AppError.conflict(
          'order_signed',
          `Order ${orderId} is ${status}; reports are attached before signing.`,
        );
      const stored = await storeReport(uploadDir, file);
      const saved = await attachments.add({
        orderId,
        followUpVisitId: null,
        ...stored,
        uploadedBy: actor.id,
      });
      const { fileName, sha256 } = stored;
      await audit.append({
        actorUserId: actor.id,
        action: 'attachment.added',
        entityType: 'order',
        entityId: orderId,
        ipAddress: actor.ipAddress,
        details: { attachmentId: saved.id, fileName, sha256, sizeBytes: saved.sizeBytes },
      });
      return {
        id: saved.id,
        fileName,
        mimeType: saved.mimeType,
        sizeBytes: saved.sizeBytes,
        sha256,
        createdAt: saved.createdAt.toISOString(),
      };
    },

    /**
     * The stored file for download, under the name it was attached with but always ending in the
     * extension of the type it was checked as (a PDF named "report.html" downloads as
     * "report.html.pdf", so it never opens as a web page).
     */
    async read(id: number, reader: Reader) {
      const row = await attachments.findById(id);
      if (!row) throw AppError.notFound(`There is no attachment ${id}.`);
      await reads.note(reader, {
        action: 'attachment.viewed',
        entityType: 'order',
        entityId: row.orderId,
        details: { attachmentId: row.id, fileName: row.fileName },
      });
      const content = await readFile(path.join(uploadDir, row.storageName));
      // The bytes must still be the ones that were stored.
      if (createHash('sha256').update(content).digest('hex') !== row.sha256) {
        throw new AppError(
          500,
          'attachment_damaged',
          'The stored file no longer matches its SHA-256; it has been changed or damaged.',
        );
      }
      const extension = extensionOf(row.mimeType);
      const downloadName = row.fileName.toLowerCase().endsWith(`.${extension}`)
        ? row.fileName
        : `${row.fileName}.${extension}`;
      return { row, content, downloadName };
    },
  };
}

export type AttachmentService = ReturnType<typeof createAttachmentService>;
