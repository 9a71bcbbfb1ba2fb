/** Short content digests for caching and for the written-back regions. */
import { sha256 } from '@noble/hashes/sha2.js';
import { bytesToHex, utf8ToBytes } from '@noble/hashes/utils.js';

/** First 8 bytes of SHA-256 (FIPS 180-4) as 16 hex digits: collisions are not a practical concern here. */
export function digest(...parts: readonly string[]): string {
  // Length-prefix each part so that ("ab","c") and ("a","bc") differ.
  const joined = parts.map((p) => `${p.length}:${p}`).join('|');
  return bytesToHex(sha256(utf8ToBytes(joined))).slice(0, 16);
}
