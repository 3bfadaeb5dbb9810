/**
 * A minimal headless-Chromium driver for tests, speaking the Chrome DevTools Protocol over
 * --remote-debugging-pipe: Chromium reads commands from fd 3 and writes replies and events to fd 4, each
 * message one JSON text followed by a NUL byte. No dependency; test-only code.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Readable, Writable } from 'node:stream';

/** Debian's chromium package. */
export const CHROMIUM = '/usr/bin/chromium';

export function chromiumPresent(): boolean {
  return existsSync(CHROMIUM);
}

type Params = Record<string, unknown>;
interface Message {
  id?: number;
  method?: string;
  params?: Params;
  result?: Params;
  error?: { code: number; message: string };
  sessionId?: string;
}

/** Flags for a quiet, sandbox-free headless start on a machine with a closed network. */
const FLAGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--disable-default-apps',
  '--disable-extensions',
  '--mute-audio',
  '--hide-scrollbars',
  '--remote-debugging-pipe',
];

export class Browser {
  private nextId = 1;
  private buffer = '';
  private readonly pending = new Map<number, { resolve: (r: Params) => void; reject: (e: Error) => void; method: string }>();
  private readonly listeners: ((m: Message) => void)[] = [];
  private stderrTail = '';
  private exited = false;

  private constructor(private readonly child: ChildProcess, private readonly profile: string, private readonly timeoutMs: number) {
    const out = child.stdio[4] as Readable;
    out.setEncoding('utf8');
    out.on('data', (chunk: string) => this.receive(chunk));
    child.stderr?.setEncoding('utf8');
    child.stderr?.on('data', (s: string) => (this.stderrTail = (this.stderrTail + s).slice(-4000)));
    child.on('exit', () => {
      this.exited = true;
      for (const p of this.pending.values()) p.reject(new Error(`chromium exited while waiting for ${p.method}; stderr: ${this.stderrTail}`));
      this.pending.clear();
    });
  }

  /** Start Chromium with a fresh profile directory. */
  static async launch(timeoutMs = 15_000): Promise<Browser> {
    const profile = mkdtempSync(join(tmpdir(), 'overcheck-chromium-'));
    const child = spawn(CHROMIUM, [...FLAGS, `--user-data-dir=${profile}`, 'about:blank'], { stdio: ['ignore', 'ignore', 'pipe', 'pipe', 'pipe'] });
    const b = new Browser(child, profile, timeoutMs);
    await new Promise<void>((resolve, reject) => {
      child.once('error', reject);
      child.once('spawn', () => resolve());
    });
    await b.send('Browser.getVersion');
    return b;
  }

  private receive(chunk: string): void {
    this.buffer += chunk;
    let end: number;
    while ((end = this.buffer.indexOf('\0')) >= 0) {
      const text = this.buffer.slice(0, end);
      this.buffer = this.buffer.slice(end + 1);
      const m = JSON.parse(text) as Message;
      if (m.id !== undefined) {
        const p = this.pending.get(m.id);
        if (!p) continue;
        this.pending.delete(m.id);
        if (m.error) p.reject(new Error(`${p.method}: ${m.error.message}`));
        else p.resolve(m.result ?? {});
      } else {
        for (const l of this.listeners) l(m);
      }
    }
  }

  /** Send one command (to the browser, or to a page's session) and wait for its reply. */
  send(method: string, params: Params = {}, sessionId?: string): Promise<Params> {
    if (this.exited) return Promise.reject(new Error(`chromium is not running (${method})`));
    const id = this.nextId++;
    const msg: Message = { id, method, params, ...(sessionId ? { sessionId } : {}) };
    return new Promise((resolve, reject) => {
      const timer = setTimeout(() => {
        this.pending.delete(id);
        reject(new Error(`${method}: no reply from chromium in ${this.timeoutMs} ms; stderr: ${this.stderrTail}`));
      }, this.timeoutMs);
      this.pending.set(id, {
        method,
        resolve: (r) => (clearTimeout(timer), resolve(r)),
        reject: (e) => (clearTimeout(timer), reject(e)),
      });
      (this.child.stdio[3] as Writable).write(`${JSON.stringify(msg)}\0`);
    });
  }

  /** Listen to every event; returns a function that stops listening. */
  onEvent(l: (m: Message) => void): () => void {
    this.listeners.push(l);
    return () => {
      const i = this.listeners.indexOf(l);
      if (i >= 0) this.listeners.splice(i, 1);
    };
  }

  /** Wait for the next event `method` of a session (started before the action that causes it). */
  waitFor(method: string, sessionId: string): Promise<Params> {
    return new Promise((resolve, reject) => {
      const timer = setTimeout(() => (stop(), reject(new Error(`${method}: not seen in ${this.timeoutMs} ms`))), this.timeoutMs);
      const stop = this.onEvent((m) => {
        if (m.method === method && m.sessionId === sessionId) {
          clearTimeout(timer);
          stop();
          resolve(m.params ?? {});
        }
      });
    });
  }

  /** A new tab with console, log, exception and network events collected. */
  async newPage(): Promise<Page> {
    const { targetId } = (await this.send('Target.createTarget', { url: 'about:blank' })) as { targetId: string };
    const { sessionId } = (await this.send('Target.attachToTarget', { targetId, flatten: true })) as { sessionId: string };
    const page = new Page(this, sessionId, targetId);
    await Promise.all(['Runtime.enable', 'Log.enable', 'Page.enable', 'Network.enable'].map((m) => this.send(m, {}, sessionId)));
    return page;
  }

  /** Close the browser (politely, then by signal to our own child), and remove the profile. */
  async close(): Promise<void> {
    if (!this.exited) {
      const gone = new Promise<void>((resolve) => this.child.once('exit', () => resolve()));
      this.send('Browser.close').catch(() => undefined);
      const timer = setTimeout(() => this.child.kill('SIGKILL'), 3000);
      await gone;
      clearTimeout(timer);
    }
    rmSync(this.profile, { recursive: true, force: true });
  }
}

export class Page {
  /** Console errors, log entries of level error, and uncaught exceptions, as text. */
  readonly errors: string[] = [];
  /** URLs of every request the page made. */
  readonly requests: string[] = [];

  constructor(private readonly browser: Browser, readonly sessionId: string, readonly targetId: string) {
    browser.onEvent((m) => {
      if (m.sessionId !== sessionId || !m.params) return;
      const p = m.params as Record<string, any>;
      if (m.method === 'Runtime.consoleAPICalled' && (p.type === 'error' || p.type === 'assert')) {
        this.errors.push(`console.${p.type}: ${(p.args ?? []).map((a: any) => a.value ?? a.description ?? '').join(' ')}`);
      } else if (m.method === 'Log.entryAdded' && p.entry?.level === 'error') {
        this.errors.push(`log (${p.entry.source}): ${p.entry.text}${p.entry.url ? ` at ${p.entry.url}` : ''}`);
      } else if (m.method === 'Runtime.exceptionThrown') {
        const d = p.exceptionDetails ?? {};
        this.errors.push(`exception: ${d.exception?.description ?? d.text ?? 'unknown'}`);
      } else if (m.method === 'Network.requestWillBeSent') {
        this.requests.push(String(p.request?.url ?? ''));
      }
    });
  }

  send(method: string, params: Params = {}): Promise<Params> {
    return this.browser.send(method, params, this.sessionId);
  }

  /** Navigate and wait for the load event. */
  async goto(url: string): Promise<void> {
    const loaded = this.browser.waitFor('Page.loadEventFired', this.sessionId);
    const r = (await this.send('Page.navigate', { url })) as { errorText?: string };
    if (r.errorText) throw new Error(`navigation to ${url} failed: ${r.errorText}`);
    await loaded;
  }

  /** Evaluate an expression in the page and return its (JSON-serialisable) value; throws on a page exception. */
  async evaluate<T>(expression: string): Promise<T> {
    const r = (await this.send('Runtime.evaluate', { expression, returnByValue: true, awaitPromise: true })) as {
      result: { value?: T };
      exceptionDetails?: { text: string; exception?: { description?: string } };
    };
    if (r.exceptionDetails) throw new Error(`evaluate: ${r.exceptionDetails.exception?.description ?? r.exceptionDetails.text}`);
    return r.result.value as T;
  }

  /** PNG of the whole page at the given CSS width (the viewport is resized to the content height). */
  async screenshot(width: number): Promise<Buffer> {
    await this.send('Emulation.setDeviceMetricsOverride', { width, height: 800, deviceScaleFactor: 1, mobile: false });
    const metrics = (await this.send('Page.getLayoutMetrics')) as { cssContentSize: { width: number; height: number } };
    const height = Math.ceil(metrics.cssContentSize.height);
    await this.send('Emulation.setDeviceMetricsOverride', { width, height, deviceScaleFactor: 1, mobile: false });
    const shot = (await this.send('Page.captureScreenshot', { format: 'png', captureBeyondViewport: true, clip: { x: 0, y: 0, width, height, scale: 1 } })) as { data: string };
    return Buffer.from(shot.data, 'base64');
  }

  /** The page printed to PDF on A4 with the page's own @page rules. */
  async pdf(): Promise<Buffer> {
    const r = (await this.send('Page.printToPDF', { preferCSSPageSize: true, printBackground: false })) as { data: string };
    return Buffer.from(r.data, 'base64');
  }
}
