/**
 * A small WebDriver BiDi client for Debian's Firefox ESR (W3C WebDriver BiDi,
 * https://w3c.github.io/webdriver-bidi/). Playwright drives only its own
 * patched Firefox build, which cannot be installed here; the stock browser
 * speaks the standard protocol, and this is the part of it the end-to-end
 * checks need: navigate, evaluate, real keyboard and pointer input, console
 * and error log, screenshots.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import WebSocket from 'ws';

export const FIREFOX = process.env.LOOPFOLD_FIREFOX ?? '/usr/bin/firefox-esr';
export const hasFirefox = (): boolean => existsSync(FIREFOX);

export interface LogEntry { level: string; text: string; type: string }

type Json = Record<string, unknown>;

export class Firefox {
  private next = 1;
  private waiting = new Map<number, { resolve(v: Json): void; reject(e: Error): void; method: string }>();
  readonly log: LogEntry[] = [];
  context = '';

  private constructor(private proc: ChildProcess, private ws: WebSocket, private dir: string) {
    ws.on('message', (data) => {
      const msg = JSON.parse(String(data)) as Json;
      if (typeof msg.id === 'number') {
        const w = this.waiting.get(msg.id);
        if (!w) return;
        this.waiting.delete(msg.id);
        if (msg.type === 'error') w.reject(new Error(`${w.method}: ${String(msg.error)}: ${String(msg.message)}`));
        else w.resolve((msg.result ?? {}) as Json);
      } else if (msg.method === 'log.entryAdded') {
        const p = msg.params as Json;
        this.log.push({ level: String(p.level), text: String(p.text ?? ''), type: String(p.type) });
      }
    });
  }

  /** Start a headless Firefox with a fresh profile and open a BiDi session on its first tab. */
  static async launch(width = 1440, height = 900): Promise<Firefox> {
    const dir = mkdtempSync(join(tmpdir(), 'loopfold-firefox-'));
    const profile = join(dir, 'profile');
    // a quiet profile: no first-run pages, no update or telemetry traffic
    const prefs: Record<string, string | boolean | number> = {
      'browser.shell.checkDefaultBrowser': false,
      'browser.startup.homepage_override.mstone': 'ignore',
      'browser.aboutwelcome.enabled': false,
      'datareporting.policy.dataSubmissionEnabled': false,
      'toolkit.telemetry.reportingpolicy.firstRun': false,
      'app.update.disabledForTesting': true,
      'browser.safebrowsing.malware.enabled': false,
      'browser.safebrowsing.phishing.enabled': false,
      'network.captive-portal-service.enabled': false,
      'dom.disable_beforeunload': false,
    };
    mkdirSync(profile, { recursive: true });
    writeFileSync(join(profile, 'user.js'), Object.entries(prefs).map(([k, v]) => `user_pref(${JSON.stringify(k)}, ${JSON.stringify(v)});`).join('\n'));
    const proc = spawn(FIREFOX, ['--headless', '--no-remote', '--profile', profile, '--remote-debugging-port=0', `--width=${width}`, `--height=${height}`, 'about:blank'], {
      env: { ...process.env, HOME: dir, MOZ_CRASHREPORTER_DISABLE: '1' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    const url = await new Promise<string>((resolve, reject) => {
      let out = '';
      const timer = setTimeout(() => reject(new Error(`Firefox did not open its WebDriver BiDi port within 60 s:\n${out}`)), 60_000);
      const onData = (b: Buffer) => {
        out += String(b);
        const m = /WebDriver BiDi listening on (ws:\/\/[^\s]+)/.exec(out);
        if (m) { clearTimeout(timer); resolve(m[1]); }
      };
      proc.stderr!.on('data', onData);
      proc.stdout!.on('data', onData);
      proc.on('exit', (code) => { clearTimeout(timer); reject(new Error(`Firefox exited (${code}) before opening its port:\n${out}`)); });
    });
    const ws = new WebSocket(`${url.replace(/\/$/, '')}/session`);
    await new Promise<void>((resolve, reject) => { ws.once('open', () => resolve()); ws.once('error', reject); });
    const ff = new Firefox(proc, ws, dir);
    await ff.send('session.new', { capabilities: { alwaysMatch: { acceptInsecureCerts: true, unhandledPromptBehavior: { beforeUnload: 'accept' } } } });
    await ff.send('session.subscribe', { events: ['log.entryAdded'] });
    const tree = await ff.send('browsingContext.getTree', {});
    // headless Firefox's start tab never has the focus (document.hasFocus() is false, focus() and blur()
    // do nothing there), so a field is never left as in a window a person uses; a tab opened over the
    // protocol has it: work in a new tab, close the start tab and bring the new one to the front
    const start = String((tree.contexts as Json[])[0].context);
    ff.context = String((await ff.send('browsingContext.create', { type: 'tab' })).context);
    await ff.send('browsingContext.close', { context: start });
    await ff.send('browsingContext.activate', { context: ff.context });
    await ff.send('browsingContext.setViewport', { context: ff.context, viewport: { width, height } });
    return ff;
  }

  send(method: string, params: Json): Promise<Json> {
    const id = this.next++;
    return new Promise((resolve, reject) => {
      this.waiting.set(id, { resolve, reject, method });
      this.ws.send(JSON.stringify({ id, method, params }));
    });
  }

  async goto(url: string): Promise<void> {
    await this.send('browsingContext.navigate', { context: this.context, url, wait: 'complete' });
  }

  async reload(): Promise<void> {
    await this.send('browsingContext.reload', { context: this.context, wait: 'complete' });
  }

  /** Evaluate a JavaScript expression in the page (promises awaited) and return its JSON value. */
  async eval<T = unknown>(expression: string): Promise<T> {
    const r = await this.send('script.evaluate', {
      expression: `(async () => JSON.stringify(await (${expression})))()`,
      target: { context: this.context },
      awaitPromise: true,
      resultOwnership: 'none',
    });
    if (r.type === 'exception') {
      const d = r.exceptionDetails as Json;
      throw new Error(`In Firefox, ${expression.slice(0, 80)}… threw: ${String(d.text)}`);
    }
    const v = (r.result as Json).value;
    return (v === undefined ? undefined : JSON.parse(String(v))) as T;
  }

  /** Poll `expression` until it is truthy (or fail after `ms`). */
  async waitFor<T = unknown>(expression: string, what: string, ms = 15_000): Promise<T> {
    const t0 = Date.now();
    let last: unknown;
    while (Date.now() - t0 < ms) {
      last = await this.eval(expression).catch((e: Error) => e.message);
      if (last && !(typeof last === 'string' && last.startsWith('In Firefox'))) return last as T;
      await new Promise((r) => setTimeout(r, 100));
    }
    throw new Error(`Timed out in Firefox waiting for ${what} (last: ${JSON.stringify(last)})`);
  }

  /** The centre of the first element matching `selector`, in viewport pixels. */
  async centre(selector: string): Promise<{ x: number; y: number }> {
    const p = await this.eval<{ x: number; y: number } | null>(`(() => { const e = document.querySelector(${JSON.stringify(selector)}); if (!e) return null; const r = e.getBoundingClientRect(); return { x: Math.round(r.x + r.width / 2), y: Math.round(r.y + r.height / 2) }; })()`);
    if (!p) throw new Error(`No element ${selector} in Firefox`);
    return p;
  }

  /** Real key presses (`keys` are WebDriver key values; modifiers are held while the others are pressed). */
  async press(keys: string[], modifiers: string[] = []): Promise<void> {
    const actions: Json[] = [];
    for (const m of modifiers) actions.push({ type: 'keyDown', value: m });
    for (const k of keys) actions.push({ type: 'keyDown', value: k }, { type: 'keyUp', value: k });
    for (const m of [...modifiers].reverse()) actions.push({ type: 'keyUp', value: m });
    await this.send('input.performActions', { context: this.context, actions: [{ type: 'key', id: 'keyboard', actions }] });
  }

  async type(text: string): Promise<void> {
    await this.press([...text]);
  }

  async click(x: number, y: number, count = 1): Promise<void> {
    const actions: Json[] = [{ type: 'pointerMove', x, y }];
    for (let i = 0; i < count; i++) actions.push({ type: 'pointerDown', button: 0 }, { type: 'pointerUp', button: 0 });
    await this.send('input.performActions', { context: this.context, actions: [{ type: 'pointer', id: 'mouse', parameters: { pointerType: 'mouse' }, actions }] });
  }

  /** Press at `from`, move in `steps` to `to`, release. */
  async drag(from: { x: number; y: number }, to: { x: number; y: number }, steps = 10): Promise<void> {
    const actions: Json[] = [{ type: 'pointerMove', x: from.x, y: from.y }, { type: 'pointerDown', button: 0 }];
    for (let i = 1; i <= steps; i++) actions.push({ type: 'pointerMove', x: Math.round(from.x + ((to.x - from.x) * i) / steps), y: Math.round(from.y + ((to.y - from.y) * i) / steps), duration: 16 });
    actions.push({ type: 'pointerUp', button: 0 });
    await this.send('input.performActions', { context: this.context, actions: [{ type: 'pointer', id: 'mouse', parameters: { pointerType: 'mouse' }, actions }] });
  }

  async screenshot(): Promise<Buffer> {
    const r = await this.send('browsingContext.captureScreenshot', { context: this.context });
    return Buffer.from(String(r.data), 'base64');
  }

  async close(): Promise<void> {
    try { await Promise.race([this.send('browser.close', {}), new Promise((r) => setTimeout(r, 3000))]); } catch { /* already gone */ }
    this.ws.close();
    if (this.proc.exitCode === null) this.proc.kill('SIGKILL');
    await new Promise((r) => setTimeout(r, 200));
    rmSync(this.dir, { recursive: true, force: true });
  }
}

