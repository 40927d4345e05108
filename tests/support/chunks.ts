/**
 * Feeds `text` to a streaming parser in pieces whose lengths cycle through `sizes`, then ends it:
 * the answer must not depend on where the pieces are cut.
 */
export function feedInChunks<R>(parser: { push(chunk: string): void; end(): R }, text: string, sizes: number[]): R {
  let pos = 0;
  let k = 0;
  while (pos < text.length) {
    const n = sizes[k++ % sizes.length];
    parser.push(text.slice(pos, pos + n));
    pos += n;
  }
  return parser.end();
}
