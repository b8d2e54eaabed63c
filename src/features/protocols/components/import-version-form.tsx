import { useId, useRef, useState, type FormEvent } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { UploadIcon } from '../../../components/ui/icons';
import { FieldError } from '../../../components/ui/text-field';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import type { VersionDetail } from '../api/protocol-response-schemas';
import { useImportVersion } from '../hooks/use-import-version';
import { PathProblemList } from './path-problem-list';

type ImportVersionFormProps = {
  onImported: (version: VersionDetail) => void;
};

/** Administrators bring in a protocol version written elsewhere; it arrives as a draft. */
export function ImportVersionForm({ onImported }: ImportVersionFormProps) {
  const importVersion = useImportVersion();
  const inputRef = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [fileError, setFileError] = useState<string | undefined>();
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;

  const onSubmit = (event: FormEvent) => {
    event.preventDefault();
    importVersion.reset();
    if (!file) {
      setFileError('Choose a protocol file (a .json file of at most 1 MB) first.');
      inputRef.current?.focus();
      return;
    }
    if (file.size > 1024 * 1024) {
      setFileError(
        `The file is ${(file.size / 1024 / 1024).toFixed(1)} MB; a protocol file may be at most 1 MB.`,
      );
      inputRef.current?.focus();
      return;
    }
    setFileError(undefined);
    importVersion.mutate(file, {
      onSuccess: (version) => {
        setFile(null);
        if (inputRef.current) inputRef.current.value = '';
        onImported(version);
      },
    });
  };

  const error = importVersion.error;
  const problems = isApiRequestError(error) ? error.fields.filter((f) => f.path !== 'file') : [];
  const fileProblem = isApiRequestError(error)
    ? error.fields.find((f) => f.path === 'file')?.message
    : undefined;
  const shownError = fileError ?? fileProblem;

  return (
    <section
      aria-labelledby={`${id}-heading`}
      className="rounded-2xl border border-paper-200 bg-white p-6"
    >
      <h2 id={`${id}-heading`} className="text-xl font-semibold text-paper-950">
        Import a version
      </h2>
      <p className="mt-1 mb-4 max-w-prose text-paper-700">
        A JSON file holding one protocol version, with{' '}
        <code className="font-mono text-sm">"approval": null</code>. It arrives as a draft; two
        different people, each a clinician or a pharmacist, must approve it before anyone can order
        with it.
      </p>
      <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
        {error && (
          <Alert
            tone="error"
            title={
              problems.length > 0
                ? 'The file was not imported: the version is not valid'
                : 'The file was not imported'
            }
          >
            {problems.length > 0 ? (
              <>
                <p>Each problem below names the place in the file (its JSON path).</p>
                <PathProblemList problems={problems} />
              </>
            ) : (
              !fileProblem && <p>{describeError(error)}</p>
            )}
          </Alert>
        )}
        <div className="flex flex-col gap-1.5">
          <label htmlFor={id} className="font-medium text-paper-900">
            Protocol file (JSON)
          </label>
          <p id={hintId} className="text-sm text-paper-600">
            One version per file, at most 1 MB.
          </p>
          <input
            ref={inputRef}
            id={id}
            type="file"
            accept="application/json,.json"
            aria-describedby={[hintId, shownError ? errorId : ''].filter(Boolean).join(' ')}
            aria-invalid={shownError ? true : undefined}
            onChange={(event) => {
              setFile(event.target.files?.[0] ?? null);
              setFileError(undefined);
              importVersion.reset();
            }}
            className={
              'w-full max-w-xl rounded-lg border bg-white px-2 py-2 text-paper-900 file:mr-3 file:rounded-md file:border file:border-paper-500 ' +
              'file:bg-paper-100 file:px-3 file:py-1.5 file:font-medium file:text-paper-900 hover:file:bg-paper-200 ' +
              (shownError ? 'border-2 border-alarm-700' : 'border-paper-500')
            }
          />
          <FieldError id={errorId} message={shownError} />
        </div>
        <div>
          <Button type="submit" icon={<UploadIcon />} busy={importVersion.isPending}>
            {importVersion.isPending ? 'Importing…' : 'Import as a draft'}
          </Button>
        </div>
      </form>
    </section>
  );
}
