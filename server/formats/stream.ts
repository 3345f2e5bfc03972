/**
 * Writes an export's pieces to a Writable (an Express Response is one) with backpressure: pieces are
 * gathered into chunks of about {@link CHUNK_CHARS} characters, and after a write that fills the
 * stream's buffer the next piece is not pulled until 'drain'. So a 100,000-row export holds a chunk at a
 * time, never the file.
 */
import { once } from 'node:events';
import type { Writable } from 'node:stream';

export const CHUNK_CHARS = 64 * 1024;

/** Waits for the first of two events, removing both listeners after (once() rejects on 'error'). */
async function firstOf(out: Writable, a: string, b: string): Promise<void> {
  const abort = new AbortController();
  try {
    await Promise.race([once(out, a, { signal: abort.signal }), once(out, b, { signal: abort.signal })]);
  } finally {
    abort.abort();
  }
}

/**
 * Pulls `pieces` to the end and writes them to `out`, then ends `out` unless `end` is false.
 * @throws whatever `pieces` throws, or Error when `out` closes or fails before the export is written;
 *   `out` is left open then, for the caller to destroy (a route: `res.destroy(error)`).
 */
export async function writeExport(
  out: Writable,
  pieces: AsyncIterable<string>,
  { end = true }: { end?: boolean } = {},
): Promise<void> {
  let failure: Error | null = null;
  const onError = (error: Error) => {
    failure = error;
  };
  const onClose = () => {
    if (!out.writableFinished)
      failure ??= new Error('the export stream closed before the export was written');
  };
  out.on('error', onError);
  out.on('close', onClose);
  const write = async (chunk: string) => {
    if (!out.write(chunk)) await firstOf(out, 'drain', 'close');
    if (failure) throw failure;
  };
  try {
    let buffered = '';
    for await (const piece of pieces) {
      if (failure) throw failure;
      buffered += piece;
      if (buffered.length >= CHUNK_CHARS) {
        await write(buffered);
        buffered = '';
      }
    }
    if (buffered) await write(buffered);
    if (end) {
      out.end();
      await firstOf(out, 'finish', 'close');
      if (failure) throw failure;
    }
  } finally {
    out.off('error', onError);
    out.off('close', onClose);
  }
}
