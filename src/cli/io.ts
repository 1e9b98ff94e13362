/** The streams a CLI command talks to, passed in so tests can run commands in-process. */
export interface CliIo {
  stdin: NodeJS.ReadableStream;
  stdout: Sink;
  stderr: Sink;
}

/** A writable end: a Node stream (write returns false when full, then emits 'drain') or a test buffer. */
export interface Sink {
  write(chunk: string | Uint8Array): unknown;
  once?(event: 'drain', listener: () => void): unknown;
}

/** Exit status of every command: 0 all done, 1 some rows failed, 2 unusable arguments. */
export const EXIT_OK = 0;
export const EXIT_ROW_FAILED = 1;
export const EXIT_USAGE = 2;

export async function readAll(stream: NodeJS.ReadableStream): Promise<string> {
  let text = '';
  stream.setEncoding('utf8');
  for await (const chunk of stream) text += chunk as string;
  return text;
}

/**
 * Output with back-pressure: lines are gathered into chunks of about 64 KB, and when the sink
 * says it is full the writer waits for 'drain' before the caller reads more input. Memory stays
 * bounded however fast the input comes and however slow the reader of stdout is.
 */
export class Output {
  private buffer = '';
  constructor(
    private readonly sink: Sink,
    private readonly chunkSize = 64 * 1024,
  ) {}

  /** Adds text; true when the caller should `await flush()` before going on. */
  add(text: string): boolean {
    this.buffer += text;
    return this.buffer.length >= this.chunkSize;
  }

  async flush(): Promise<void> {
    if (this.buffer === '') return;
    const text = this.buffer;
    this.buffer = '';
    const sink = this.sink;
    if (sink.write(text) === false && sink.once) {
      await new Promise<void>((resolve) => sink.once!('drain', resolve));
    }
  }
}

/**
 * Output like `Output`, encoded as it is added: text goes into a byte buffer, and bytes that
 * repeat (a cell made once) are copied in as bytes, so a long text with a character beyond
 * Latin-1 (an en dash in a warning) is not encoded to UTF-8 again on every row.
 */
export class ByteOutput {
  private bytes: Buffer;
  private at = 0;
  constructor(
    private readonly sink: Sink,
    private readonly chunkSize = 64 * 1024,
  ) {
    this.bytes = Buffer.allocUnsafe(2 * chunkSize);
  }

  private room(n: number): void {
    if (this.at + n <= this.bytes.length) return;
    const bigger = Buffer.allocUnsafe(Math.max(2 * this.bytes.length, this.at + n));
    this.bytes.copy(bigger, 0, 0, this.at);
    this.bytes = bigger;
  }

  /** Adds text; true when the caller should `await flush()` before going on. */
  add(text: string): boolean {
    this.room(3 * text.length);
    this.at += this.bytes.write(text, this.at, 'utf8');
    return this.at >= this.chunkSize;
  }

  /** Adds encoded text (UTF-8); true when the caller should `await flush()`. */
  addBytes(b: Uint8Array): boolean {
    this.room(b.length);
    this.bytes.set(b, this.at);
    this.at += b.length;
    return this.at >= this.chunkSize;
  }

  async flush(): Promise<void> {
    if (this.at === 0) return;
    // The sink may hold the chunk until it is written: the next one goes into a new buffer.
    const chunk = this.bytes.subarray(0, this.at);
    this.bytes = Buffer.allocUnsafe(this.bytes.length);
    this.at = 0;
    const sink = this.sink;
    if (sink.write(chunk) === false && sink.once) {
      await new Promise<void>((resolve) => sink.once!('drain', resolve));
    }
  }
}

/** One input line: its 1-based number and text (without the line end), or that it was too long. */
export type InputLine = { line: number; text: string; tooLong?: false } | { line: number; tooLong: true };

/** Longest line read whole; a longer one is skipped to its end and reported, so memory stays bounded. */
export const MAX_LINE_CHARS = 1 << 20;

/**
 * Splits a stream into lines at LF only (a CR before the LF is dropped; a lone CR is part of the
 * line, so it never splits a record in two), strips a leading byte-order mark, and yields every
 * line including blank ones, so outputs can be matched to inputs one to one. A final line without
 * a line end counts; an empty remainder after the last LF does not. Lines come in batches, one
 * per chunk read, so the cost of waiting for input is paid per chunk and not per line.
 */
export async function* inputLines(stream: NodeJS.ReadableStream): AsyncGenerator<InputLine[]> {
  stream.setEncoding('utf8');
  let carry = '';
  let line = 0;
  let skipping = false;
  let first = true;
  for await (const piece of stream) {
    let chunk = piece as string;
    if (first) {
      first = false;
      if (chunk.charCodeAt(0) === 0xfeff) chunk = chunk.slice(1);
    }
    const batch: InputLine[] = [];
    let start = 0;
    for (let nl = chunk.indexOf('\n'); nl >= 0; nl = chunk.indexOf('\n', start)) {
      line++;
      if (skipping) {
        skipping = false;
        batch.push({ line, tooLong: true });
      } else {
        let text = carry === '' ? chunk.slice(start, nl) : carry + chunk.slice(start, nl);
        if (text.endsWith('\r')) text = text.slice(0, -1);
        batch.push(text.length > MAX_LINE_CHARS ? { line, tooLong: true } : { line, text });
      }
      carry = '';
      start = nl + 1;
    }
    if (!skipping) {
      carry += chunk.slice(start);
      if (carry.length > MAX_LINE_CHARS) {
        carry = '';
        skipping = true;
      }
    }
    if (batch.length > 0) yield batch;
  }
  if (skipping) yield [{ line: line + 1, tooLong: true }];
  else if (carry !== '') yield [{ line: line + 1, text: carry.endsWith('\r') ? carry.slice(0, -1) : carry }];
}
