import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';

/** Debian's chromium (scripts/install-chromium.sh); PLATESMITH_CHROMIUM names another binary. */
export function chromiumPath(): string | null {
  const p = process.env.PLATESMITH_CHROMIUM ?? '/usr/bin/chromium';
  return existsSync(p) ? p : null;
}

/** Why a PDF could not be printed, as data (the caller maps it: a 406/503 answer, exit code 2). */
export class PdfUnavailable extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'PdfUnavailable';
  }
}

/**
 * Prints a self-contained HTML document to PDF with headless Chromium (`--print-to-pdf`; the
 * page size and margins come from the document's @page rule). A child process, so the caller's
 * event loop is free while it prints; killed after `timeoutMs` or when `signal` aborts (the
 * promise then rejects with the signal's reason). Each call gets its own profile directory, so
 * prints may run side by side.
 */
export async function htmlToPdf(html: string, opts: { timeoutMs?: number; signal?: AbortSignal } = {}): Promise<Buffer> {
  opts.signal?.throwIfAborted();
  const bin = chromiumPath();
  if (!bin) throw new PdfUnavailable('chromium is not installed (bash scripts/install-chromium.sh, or set PLATESMITH_CHROMIUM)');
  const dir = await mkdtemp(join(tmpdir(), 'platesmith-pdf-'));
  try {
    const src = join(dir, 'record.html');
    const out = join(dir, 'record.pdf');
    await writeFile(src, html);
    const args = [
      '--headless',
      '--disable-gpu',
      '--no-sandbox',
      '--no-first-run',
      '--no-pdf-header-footer',
      `--user-data-dir=${join(dir, 'profile')}`,
      `--print-to-pdf=${out}`,
      pathToFileURL(src).href,
    ];
    await new Promise<void>((resolve, reject) => {
      const child = spawn(bin, args, { stdio: ['ignore', 'ignore', 'pipe'] });
      let err = '';
      child.stderr.on('data', (b: Buffer) => {
        if (err.length < 4000) err += b.toString();
      });
      const timer = setTimeout(() => child.kill('SIGKILL'), opts.timeoutMs ?? 60_000);
      const onAbort = (): void => {
        child.kill('SIGKILL');
      };
      opts.signal?.addEventListener('abort', onAbort, { once: true });
      child.on('error', (e) => {
        clearTimeout(timer);
        opts.signal?.removeEventListener('abort', onAbort);
        reject(new PdfUnavailable(`chromium could not start: ${e.message}`));
      });
      child.on('close', (code, signal) => {
        clearTimeout(timer);
        opts.signal?.removeEventListener('abort', onAbort);
        if (opts.signal?.aborted) reject(opts.signal.reason);
        else if (code === 0 && existsSync(out)) resolve();
        else reject(new PdfUnavailable(`chromium did not print the PDF (${signal ?? `exit ${code}`}): ${err.split('\n').filter((l) => l.trim()).slice(-2).join(' ')}`));
      });
    });
    return await readFile(out);
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}
