/**
 * Canonical JSON of a protocol version, the text the server hashes with SHA-256: object keys
 * sorted recursively by UTF-16 code unit (as in RFC 8785), no whitespace, numbers and strings
 * written by JSON.stringify. Object properties that are undefined are left out, as
 * JSON.stringify does; anything JSON cannot carry faithfully is refused rather than guessed.
 */
export function canonicalJson(value: unknown): string {
  return write(value, '$');
}

function write(value: unknown, path: string): string {
  if (value === null) return 'null';
  switch (typeof value) {
    case 'string':
    case 'boolean':
      return JSON.stringify(value);
    case 'number':
      if (!Number.isFinite(value))
        throw new TypeError(`canonicalJson: ${path} is ${value}, which JSON cannot carry`);
      return JSON.stringify(value);
    case 'object': {
      if (Array.isArray(value)) {
        return `[${value.map((item, index) => write(item, `${path}[${index}]`)).join(',')}]`;
      }
      const prototype = Object.getPrototypeOf(value) as unknown;
      if (prototype !== Object.prototype && prototype !== null) {
        throw new TypeError(`canonicalJson: ${path} is not a plain object`);
      }
      const record = value as Record<string, unknown>;
      const members = Object.keys(record)
        .sort()
        .filter((key) => record[key] !== undefined)
        .map((key) => `${JSON.stringify(key)}:${write(record[key], `${path}.${key}`)}`);
      return `{${members.join(',')}}`;
    }
    default:
      throw new TypeError(`canonicalJson: ${path} is ${typeof value}, which JSON cannot carry`);
  }
}
