/**
 * Shared plumbing of the engine's command lines (analyze, match, refine, yield): read the design
 * from a path or standard input, print the JSON result, and turn any failure into ONE line
 * `path: reason` on standard error with exit status 2 — never a stack trace.
 */
import { readFile } from 'node:fs/promises';
import { DesignError, parseDesignText, type Design } from '../../shared/rf/design';

const USAGE = 'usage: npm run --silent <command> -- <design.matchloom.json | -> [options]';

/**
 * The design argument: the first argument that is "-" or not an option, skipping the value that
 * follows a `--name` written without "=" (so `--trials 2000 design.json` works). Put the path first,
 * or write flags as `--name=value`, when a flag takes no value.
 */
export function designArg(argv: readonly string[]): string | undefined {
  for (let k = 0; k < argv.length; k++) {
    const a = argv[k];
    if (a === '-') return a;
    if (a === '--') continue;
    if (a.startsWith('--')) {
      if (!a.includes('=') && k + 1 < argv.length && !argv[k + 1].startsWith('-')) k++;
      continue;
    }
    return a;
  }
  return undefined;
}

async function readStdin(): Promise<string> {
  const chunks: Buffer[] = [];
  for await (const chunk of process.stdin) chunks.push(typeof chunk === 'string' ? Buffer.from(chunk) : (chunk as Buffer));
  return Buffer.concat(chunks).toString('utf8');
}

/** Read and check the design named by argv (a path, or "-" for standard input). Throws DesignError. */
export async function readDesignArg(argv: string[]): Promise<Design> {
  const arg = designArg(argv);
  if (arg === undefined) throw new DesignError('', `no design file given (${USAGE})`);
  let text: string;
  try {
    text = arg === '-' ? await readStdin() : await readFile(arg, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw new DesignError('', `cannot read ${arg === '-' ? 'standard input' : JSON.stringify(arg)}${code ? ` (${code})` : ''}`);
  }
  return parseDesignText(text);
}

/** One line for any failure: `path: reason` for a DesignError (the root is called "design"), else the message. */
export function cliErrorLine(err: unknown): string {
  let line: string;
  if (err instanceof DesignError) line = `${err.path || 'design'}: ${err.reason}`;
  else if (err instanceof Error) line = err.message || err.name;
  else line = String(err);
  return line.replace(/\s*[\r\n]+\s*/g, ' ').trim() || 'error';
}

/**
 * Run `main(argv)`; print its result as JSON on standard output (nothing for undefined). On any
 * error print one line on standard error and exit with status 2. JSON.stringify writes any
 * non-finite number as null, so NaN never reaches the output.
 */
export function runCli(main: (argv: string[]) => Promise<unknown>): void {
  const fail = (err: unknown) => {
    process.stderr.write(`${cliErrorLine(err)}\n`);
    process.exitCode = 2;
  };
  process.on('uncaughtException', (err) => {
    fail(err);
    process.exit(2);
  });
  let started: Promise<unknown>;
  try {
    started = main(process.argv.slice(2));
  } catch (err) {
    fail(err);
    return;
  }
  started.then(
    (result) => {
      if (result === undefined) return;
      process.stdout.write(`${JSON.stringify(result)}\n`);
    },
    fail,
  );
}
