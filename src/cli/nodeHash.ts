import { createHash } from 'node:crypto';
import type { Sha512 } from '../io/sha512';

/**
 * SHA-512 through Node's crypto: the same digest as the pure-TypeScript src/io/sha512.ts (checked in
 * test/io/sha512.test.ts) about eight times faster, for the CLI's streamed gigabyte exports.
 */
export function createNodeSha512(): Pick<Sha512, 'update' | 'digestHex'> {
  const h = createHash('sha512');
  const api = {
    update(bytes: Uint8Array) {
      h.update(bytes);
      return api as unknown as Sha512;
    },
    digestHex() {
      return h.digest('hex');
    },
  };
  return api;
}
