import { SelectField } from './select-field';

/** What a protocol filter needs to know of each protocol, whichever feature loaded the list. */
export type ProtocolVersionChoice = {
  key: string;
  title: string;
  versions: ReadonlyArray<{ version: number }>;
};

type ProtocolVersionFieldsProps = {
  /** The protocols to choose from; undefined while the list is loading. */
  choices: readonly ProtocolVersionChoice[] | undefined;
  loadFailed: boolean;
  protocol: string | undefined;
  version: number | undefined;
  /** Problems the server found with either value, by parameter name. */
  errors: Partial<Record<'protocol' | 'version', string>>;
  onChange: (changes: { protocol?: string; version?: number }) => void;
};

/**
 * A protocol select and a version select that offers the chosen protocol's versions. A value
 * from the address that the list does not (or not yet) hold is still offered, so the selects
 * never show something other than the filter in force.
 */
export function ProtocolVersionFields({
  choices,
  loadFailed,
  protocol,
  version,
  errors,
  onChange,
}: ProtocolVersionFieldsProps) {
  const chosen = choices?.find((p) => p.key === protocol);
  return (
    <>
      <SelectField
        label="Protocol"
        value={protocol ?? ''}
        error={
          loadFailed
            ? 'The protocol list could not be loaded; reload the page to try again.'
            : errors.protocol
        }
        onChange={(e) => onChange({ protocol: e.target.value || undefined })}
      >
        <option value="">Any protocol</option>
        {(choices ?? []).map((p) => (
          <option key={p.key} value={p.key}>
            {p.title}
          </option>
        ))}
        {protocol && !chosen && <option value={protocol}>{protocol}</option>}
      </SelectField>
      <SelectField
        label="Protocol version"
        hint={protocol ? undefined : 'Choose a protocol first.'}
        value={version === undefined ? '' : String(version)}
        disabled={!protocol}
        error={errors.version}
        onChange={(e) => onChange({ version: e.target.value ? Number(e.target.value) : undefined })}
      >
        <option value="">Every version</option>
        {(chosen?.versions ?? []).map((v) => (
          <option key={v.version} value={v.version}>
            Version {v.version}
          </option>
        ))}
        {version !== undefined && !chosen?.versions.some((v) => v.version === version) && (
          <option value={version}>Version {version}</option>
        )}
      </SelectField>
    </>
  );
}
