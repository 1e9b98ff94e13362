/** The streams a CLI command talks to, passed in so tests can run commands in-process. */
export interface CliIo {
  stdin: NodeJS.ReadableStream;
  stdout: { write(chunk: string): unknown };
  stderr: { write(chunk: string): unknown };
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
