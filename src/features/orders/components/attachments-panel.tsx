import { useId, useRef, useState, type FormEvent } from 'react';
import { formatUnitDateTime } from '../../../lib/unit-times';
import type { OrderDetail } from '../../../../shared/schemas/orders';
import { Button } from '../../../components/ui/button';
import { FileDownloadIcon, PaperclipIcon, UploadIcon } from '../../../components/ui/icons';
import { FieldError } from '../../../components/ui/text-field';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { attachmentMaxBytes } from '../api/upload-attachment';
import { useUploadAttachment } from '../hooks/use-upload-attachment';

function sizeText(bytes: number): string {
  if (bytes < 1024) return `${bytes} bytes`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(0)} kB`;
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

function uploadProblem(error: unknown): string {
  if (!isApiRequestError(error)) return describeError(error);
  if (error.status === 413)
    return 'The file is larger than 10 MB. Save the report at a lower resolution, or as a PDF, and try again.';
  if (error.status === 415) return `${error.message} Choose a PDF, PNG or JPEG file.`;
  if (error.status === 409) return `${error.message}`;
  return error.message;
}

/** Reports attached to the order: download for everyone, upload while it is a draft. */
export function AttachmentsPanel({ order, canUpload }: { order: OrderDetail; canUpload: boolean }) {
  const upload = useUploadAttachment();
  const inputRef = useRef<HTMLInputElement>(null);
  const [localError, setLocalError] = useState<string | undefined>();
  const [added, setAdded] = useState('');
  const id = useId();
  const error = localError ?? (upload.error ? uploadProblem(upload.error) : undefined);
  const errorId = error ? `${id}-error` : undefined;

  const submit = (event: FormEvent) => {
    event.preventDefault();
    setAdded('');
    upload.reset();
    const file = inputRef.current?.files?.[0];
    if (!file) {
      setLocalError('Choose a file first: a PDF, PNG or JPEG of up to 10 MB.');
      inputRef.current?.focus();
      return;
    }
    if (file.size > attachmentMaxBytes) {
      setLocalError(`“${file.name}” is ${sizeText(file.size)}; reports can be at most 10 MB.`);
      inputRef.current?.focus();
      return;
    }
    setLocalError(undefined);
    upload.mutate(
      { orderId: order.id, file },
      {
        onSuccess: (attachment) => {
          setAdded(`“${attachment.fileName}” was attached.`);
          if (inputRef.current) inputRef.current.value = '';
        },
        onError: () => inputRef.current?.focus(),
      },
    );
  };

  return (
    <section
      aria-labelledby={`${id}-heading`}
      className="space-y-3 rounded-2xl border border-paper-200 bg-white p-5"
    >
      <h2
        id={`${id}-heading`}
        className="flex items-center gap-2 text-xl font-semibold text-paper-950"
      >
        <PaperclipIcon className="size-5" />
        Measurement reports
      </h2>
      {order.attachments.length === 0 ? (
        <p className="text-paper-700">No report attached.</p>
      ) : (
        <ul className="divide-y divide-paper-200 rounded-lg border border-paper-200">
          {order.attachments.map((a) => (
            <li key={a.id} className="flex flex-wrap items-center justify-between gap-3 px-3 py-2">
              <span className="min-w-0">
                <span className="block font-medium text-paper-950 [overflow-wrap:anywhere]">
                  {a.fileName}
                </span>
                <span className="text-sm text-paper-600">
                  {a.mimeType === 'application/pdf'
                    ? 'PDF'
                    : a.mimeType === 'image/png'
                      ? 'PNG image'
                      : 'JPEG image'}{' '}
                  · {sizeText(a.sizeBytes)} · added {formatUnitDateTime(a.createdAt)} · SHA-256{' '}
                  {a.sha256.slice(0, 12)}…
                </span>
              </span>
              <a
                href={`/api/attachments/${a.id}`}
                download={a.fileName}
                className="inline-flex min-h-10 items-center gap-2 rounded-lg border border-paper-500 bg-white px-3 py-1.5 text-sm font-medium text-paper-900 hover:bg-paper-100"
              >
                <FileDownloadIcon className="size-4" />
                Download<span className="sr-only"> {a.fileName}</span>
              </a>
            </li>
          ))}
        </ul>
      )}
      {canUpload && (
        <form onSubmit={submit} noValidate className="space-y-2">
          <label htmlFor={`${id}-file`} className="block font-medium text-paper-900">
            Attach a report
          </label>
          <p id={`${id}-hint`} className="text-sm text-paper-600">
            PDF, PNG or JPEG, up to 10 MB: the angiogram or tomography report, or the pachymetry
            print-out. Reports are attached before signing.
          </p>
          <div className="flex flex-wrap items-center gap-3">
            <input
              ref={inputRef}
              id={`${id}-file`}
              type="file"
              accept=".pdf,.png,.jpg,.jpeg,application/pdf,image/png,image/jpeg"
              aria-describedby={[`${id}-hint`, errorId].filter(Boolean).join(' ')}
              aria-invalid={error ? true : undefined}
              className="min-h-tap max-w-full rounded-lg border border-paper-500 bg-white px-2 py-1.5 text-paper-900 file:mr-3 file:rounded-md file:border-0 file:bg-paper-200 file:px-3 file:py-1.5 file:font-medium file:text-paper-900"
              onChange={() => {
                setLocalError(undefined);
                upload.reset();
              }}
            />
            <Button type="submit" variant="secondary" icon={<UploadIcon />} busy={upload.isPending}>
              {upload.isPending ? 'Uploading…' : 'Upload'}
            </Button>
          </div>
          <FieldError id={errorId} message={error} />
          <p role="status" className="text-sm text-paper-800">
            {added}
          </p>
        </form>
      )}
    </section>
  );
}
