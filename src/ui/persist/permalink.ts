/**
 * The current configuration in the page's URL: `#config=` followed by the configuration's JSON
 * (the same JSON the CLI takes) as UTF-8 in base64url. Opening such a link restores the view.
 */

const PREFIX = 'config=';

function toBase64Url(bytes: Uint8Array): string {
  let binary = '';
  for (const byte of bytes) binary += String.fromCharCode(byte);
  return btoa(binary).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
}

function fromBase64Url(text: string): Uint8Array {
  const base64 = text.replace(/-/g, '+').replace(/_/g, '/');
  const binary = atob(base64 + '='.repeat((4 - (base64.length % 4)) % 4));
  return Uint8Array.from(binary, (c) => c.charCodeAt(0));
}

/** The URL hash ("#config=…") for `config`. */
export function encodeConfigHash(config: unknown): string {
  return `#${PREFIX}${toBase64Url(new TextEncoder().encode(JSON.stringify(config)))}`;
}

export type DecodedHash = { kind: 'none' } | { kind: 'config'; config: unknown } | { kind: 'invalid'; message: string };

/** Reads a hash made by encodeConfigHash; anything else is "none", a damaged link "invalid" with the reason. */
export function decodeConfigHash(hash: string): DecodedHash {
  const body = hash.startsWith('#') ? hash.slice(1) : hash;
  if (!body.startsWith(PREFIX)) return { kind: 'none' };
  const payload = body.slice(PREFIX.length);
  try {
    const text = new TextDecoder('utf-8', { fatal: true }).decode(fromBase64Url(payload));
    return { kind: 'config', config: JSON.parse(text) as unknown };
  } catch (error) {
    return { kind: 'invalid', message: `The link's configuration could not be read (${error instanceof Error ? error.message : String(error)}).` };
  }
}
