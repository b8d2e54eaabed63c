import type { DataSource } from 'typeorm';
import { Attachment } from '../db/entities/attachment';
import { TreatmentOrder } from '../db/entities/treatment-order';

export function createAttachmentRepository(dataSource: DataSource) {
  const attachments = dataSource.getRepository(Attachment);
  return {
    /** The order a report is attached to: only its status matters here. */
    orderStatus: async (orderId: number) =>
      (
        await dataSource
          .getRepository(TreatmentOrder)
          .findOne({ where: { id: orderId }, select: { id: true, status: true } })
      )?.status ?? null,
    add: (row: Omit<Attachment, 'id' | 'createdAt' | 'order'>) =>
      attachments.save(attachments.create(row)),
    findById: (id: number) => attachments.findOneBy({ id }),
  };
}

export type AttachmentRepository = ReturnType<typeof createAttachmentRepository>;
