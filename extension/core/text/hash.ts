/**
 * A fast 53-bit string hash (cyrb53, public domain) used for cache keys. Not cryptographic:
 * a collision would only make the cache serve a stale result for an identical-looking key.
 */
export function hashText(text: string, seed = 0): string {
  return hashParts([text], seed);
}

/** Hash of several parts, order-sensitive: the hash of the parts joined by U+0000, without joining them. */
export function hashParts(parts: readonly string[], seed = 0): string {
  let h1 = 0xdeadbeef ^ seed;
  let h2 = 0x41c6ce57 ^ seed;
  for (let p = 0; p < parts.length; p++) {
    if (p > 0) {
      h1 = Math.imul(h1, 2654435761);
      h2 = Math.imul(h2, 1597334677);
    }
    const text = parts[p];
    for (let i = 0; i < text.length; i++) {
      const ch = text.charCodeAt(i);
      h1 = Math.imul(h1 ^ ch, 2654435761);
      h2 = Math.imul(h2 ^ ch, 1597334677);
    }
  }
  h1 = Math.imul(h1 ^ (h1 >>> 16), 2246822507) ^ Math.imul(h2 ^ (h2 >>> 13), 3266489909);
  h2 = Math.imul(h2 ^ (h2 >>> 16), 2246822507) ^ Math.imul(h1 ^ (h1 >>> 13), 3266489909);
  return (4294967296 * (2097151 & h2) + (h1 >>> 0)).toString(36);
}
