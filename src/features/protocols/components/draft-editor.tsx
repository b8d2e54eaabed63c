import { useCallback, useId, useRef, useState, type FormEvent } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { CheckCircleIcon, PencilIcon } from '../../../components/ui/icons';
import { KeptDraftOffer } from '../../../components/ui/kept-draft-offer';
import { describeError, isApiRequestError } from '../../../lib/api-client';
import { useStateDraft } from '../../../lib/form-draft';
import type { VersionDetail } from '../api/protocol-response-schemas';
import { useUpdateDraft } from '../hooks/use-update-draft';
import { LabelledTextarea } from './labelled-textarea';
import { PathProblemList } from './path-problem-list';
import { shortSha256 } from './protocol-labels';

function asText(definition: unknown): string {
  return JSON.stringify(definition, null, 2);
}

/** Where JSON.parse stopped, as a line and column a person can find. */
function jsonProblem(text: string): string | null {
  try {
    JSON.parse(text);
    return null;
  } catch (error) {
    const message = error instanceof Error ? error.message : 'not valid JSON';
    const position = /position (\d+)/.exec(message);
    if (!position) return `The text is not valid JSON: ${message}`;
    const before = text.slice(0, Number(position[1]));
    const line = before.split('\n').length;
    const column = before.length - before.lastIndexOf('\n');
    return `The text is not valid JSON at line ${line}, column ${column}: ${message.replace(/ in JSON at position \d+.*$/, '')}`;
  }
}

/**
 * A draft's whole definition as JSON text. The server checks it against the protocol schema and
 * lists each problem by its path; a form per field is for later.
 */
export function DraftEditor({ draft }: { draft: VersionDetail }) {
  const update = useUpdateDraft();
  const [open, setOpen] = useState(false);
  const [text, setText] = useState(() => asText(draft.definition));
  const [parseError, setParseError] = useState<string | undefined>();
  const [saved, setSaved] = useState<string | null>(null);
  const textareaRef = useRef<HTMLTextAreaElement>(null);
  const regionId = useId();
  const savedText = asText(draft.definition);
  // Until the saved version comes back from the server, the text just saved is not a change either.
  const justSaved = useRef<string | null>(null);
  const differs = useCallback(
    (kept: string) => kept !== savedText && kept !== justSaved.current,
    [savedText],
  );
  const kept = useStateDraft(
    `protocol-draft.${draft.key}.${draft.version}`,
    text,
    setText,
    differs,
  );
  const keptOffer = { ...kept, restore: () => (kept.restore(), setOpen(true)) };

  const onSubmit = (event: FormEvent) => {
    event.preventDefault();
    setSaved(null);
    update.reset();
    const problem = jsonProblem(text);
    if (problem) {
      setParseError(problem);
      textareaRef.current?.focus();
      return;
    }
    setParseError(undefined);
    update.mutate(
      { key: draft.key, version: draft.version, definition: JSON.parse(text) as unknown },
      {
        onSuccess: (version) => {
          justSaved.current = asText(version.definition);
          setText(justSaved.current);
          kept.clear();
          setSaved(
            version.sha256 === draft.sha256
              ? 'Saved. Nothing in the definition changed.'
              : `Saved. The SHA-256 is now ${shortSha256(version.sha256)}; approvals given before this change no longer count.`,
          );
        },
      },
    );
  };

  const error = update.error;
  const problems = isApiRequestError(error) ? error.fields : [];
  const changed = text !== asText(draft.definition);

  return (
    <section
      aria-labelledby={`${regionId}-heading`}
      className="rounded-2xl border border-paper-200 bg-white p-5"
    >
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div>
          <h2 id={`${regionId}-heading`} className="text-lg font-semibold text-paper-950">
            Edit this draft
          </h2>
          <p className="text-sm text-paper-700">
            The whole definition as JSON. Saving replaces the draft and clears approvals given so
            far.
          </p>
        </div>
        <Button
          variant="secondary"
          icon={<PencilIcon />}
          aria-expanded={open}
          aria-controls={regionId}
          onClick={() => setOpen((o) => !o)}
        >
          {open ? 'Close the editor' : 'Open the editor'}
        </Button>
      </div>
      {kept.offered && (
        <div className="mt-4">
          <KeptDraftOffer draft={keptOffer} what="changes to this definition" />
        </div>
      )}
      <div role="status" className={saved ? 'mt-4' : 'sr-only'}>
        {saved && (
          <p className="flex items-center gap-2 rounded-lg border border-iris-200 bg-iris-50 px-4 py-3 font-medium text-iris-900">
            <CheckCircleIcon className="size-5" />
            {saved}
          </p>
        )}
      </div>
      {open && (
        <form id={regionId} onSubmit={onSubmit} noValidate className="mt-4 flex flex-col gap-4">
          {error && (
            <Alert
              tone="error"
              title={problems.length > 0 ? 'Not saved: the definition is not valid' : 'Not saved'}
            >
              {problems.length > 0 ? (
                <>
                  <p>Each problem names the place in the definition (its JSON path).</p>
                  <PathProblemList problems={problems} stripPrefix="definition." />
                </>
              ) : (
                <p>{describeError(error)}</p>
              )}
            </Alert>
          )}
          <LabelledTextarea
            ref={textareaRef}
            label="Definition (JSON)"
            hint={`Keep "key": "${draft.key}", "version": ${draft.version} and "approval": null. Units are in each name (for example exposureS is in seconds).`}
            rows={24}
            spellCheck={false}
            autoCapitalize="off"
            autoCorrect="off"
            className="font-mono text-sm leading-relaxed"
            value={text}
            error={parseError}
            onChange={(event) => {
              setText(event.target.value);
              setSaved(null);
            }}
          />
          <div className="flex flex-wrap gap-3">
            <Button type="submit" busy={update.isPending} disabled={!changed && !update.isError}>
              {update.isPending ? 'Saving…' : 'Save the draft'}
            </Button>
            <Button
              variant="secondary"
              disabled={!changed || update.isPending}
              onClick={() => {
                setText(asText(draft.definition));
                setParseError(undefined);
                update.reset();
              }}
            >
              Undo my changes
            </Button>
          </div>
        </form>
      )}
    </section>
  );
}
