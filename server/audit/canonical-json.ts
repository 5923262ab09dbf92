/**
 * Canonical JSON for hashing: object keys sorted by code unit, no whitespace, `undefined`
 * dropped from objects and written as null in arrays, Dates as ISO strings (what JSON.stringify
 * does), non-finite numbers refused. The same value read back from a jsonb column (which
 * reorders keys) gives the same text, so a row's hash can be recomputed from what is stored.
 * (In the spirit of RFC 8785, JSON Canonicalization Scheme; not a full implementation of it.)
 */
export function canonicalJson(value: unknown): string {
  return write(toJsonValue(value));
}

/** The value as JSON would carry it (Dates → strings, toJSON honoured, undefined dropped). */
export function toJsonValue(value: unknown): unknown {
  if (value === undefined) return null;
  const text = JSON.stringify(value);
  return text === undefined ? null : JSON.parse(text);
}

function write(v: unknown): string {
  if (v === null) return 'null';
  if (typeof v === 'number') {
    if (!Number.isFinite(v)) throw new Error('canonicalJson: non-finite number');
    return JSON.stringify(v);
  }
  if (typeof v === 'string' || typeof v === 'boolean') return JSON.stringify(v);
  if (Array.isArray(v)) return `[${v.map(write).join(',')}]`;
  if (typeof v === 'object') {
    const o = v as Record<string, unknown>;
    const keys = Object.keys(o)
      .filter((k) => o[k] !== undefined)
      .sort();
    return `{${keys.map((k) => `${JSON.stringify(k)}:${write(o[k])}`).join(',')}}`;
  }
  throw new Error(`canonicalJson: cannot write a ${typeof v}`);
}
