/** The API address of one protocol version; keys and numbers are encoded, never trusted as typed. */
export function versionAddress(key: string, version: number): string {
  return `/protocols/${encodeURIComponent(key)}/versions/${encodeURIComponent(String(version))}`;
}

export type VersionRef = { key: string; version: number };
