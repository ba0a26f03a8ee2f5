/**
 * Browser-test harness: a real Deckshare server on a free port with a fresh SQLite file (the
 * server migrates it and seeds the demo firm), and Debian's Chromium, headless, driven by
 * playwright-core through a fresh profile. Builds nothing: run `npm run build` first so the
 * server has dist/ to serve.
 *
 *   const h = await startHarness();
 *   await h.page.goto(h.url('/sign-in'));
 *   await h.screenshot('sign-in');
 *   await h.stop();
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type BrowserContext, type Locator, type Page } from 'playwright-core';

export const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
export const SCREENSHOT_DIR = join(ROOT, 'tests/e2e/screenshots');
export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

/** Flags that work for Debian's Chromium headless with no GPU (software rendering keeps WebGL). */
export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/** The demo users the server seeds into an empty database (all share one password). */
export const DEMO_PASSWORD = 'deckshare-demo-1';
export const DEMO_FIRM = 'Larchmont Ridge Engineering';
export const DEMO_USERS = {
  admin: 'admin@larchmont-ridge.example',
  designer: 'designer@larchmont-ridge.example',
  reviewer: 'reviewer@larchmont-ridge.example',
  instructor: 'instructor@larchmont-ridge.example',
  trainee: 'trainee@larchmont-ridge.example',
} as const;

export interface HarnessOptions {
  /** Extra environment for the server (e.g. a lower sign-in limit). */
  env?: Record<string, string>;
  /** Browser window size; defaults to 1366 × 900. */
  viewport?: { width: number; height: number };
}

export interface Harness {
  baseUrl: string;
  port: number;
  databaseUrl: string;
  context: BrowserContext;
  page: Page;
  /** Absolute URL for a path of the app. */
  url(path: string): string;
  /** Saves a full-page PNG to tests/e2e/screenshots/<name>.png and returns its path. */
  screenshot(name: string, page?: Page): Promise<string>;
  /** Uncaught errors and console errors the pages reported so far. */
  pageErrors: string[];
  /** Everything the server printed so far. */
  serverLog(): string;
  /** Closes the browser, stops the server, removes the temporary files. */
  stop(): Promise<void>;
}

/** A TCP port nobody is listening on right now. */
export function freePort(): Promise<number> {
  return new Promise((resolvePort, reject) => {
    const probe = createServer();
    probe.unref();
    probe.on('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      if (address === null || typeof address === 'string') {
        probe.close();
        reject(new Error('could not find a free port'));
        return;
      }
      const { port } = address;
      probe.close(() => resolvePort(port));
    });
  });
}

async function waitForHealth(baseUrl: string, server: ChildProcess, log: () => string, timeoutMs: number): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  let lastProblem = 'no answer yet';
  while (Date.now() < deadline) {
    if (server.exitCode !== null || server.signalCode !== null) {
      throw new Error(`The server exited (${server.exitCode ?? server.signalCode}) before answering /api/health.\n${log()}`);
    }
    try {
      const response = await fetch(`${baseUrl}/api/health`);
      if (response.ok) {
        const body = (await response.json()) as { status?: string };
        if (body.status === 'ok') return;
        lastProblem = `health answered ${JSON.stringify(body)}`;
      } else {
        lastProblem = `health answered HTTP ${response.status}`;
      }
    } catch (error) {
      lastProblem = error instanceof Error ? error.message : String(error);
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`The server did not become healthy within ${timeoutMs} ms (${lastProblem}).\n${log()}`);
}

function stopProcess(child: ChildProcess, graceMs = 5000): Promise<void> {
  return new Promise((resolveStop) => {
    if (child.exitCode !== null || child.signalCode !== null) {
      resolveStop();
      return;
    }
    const timer = setTimeout(() => child.kill('SIGKILL'), graceMs);
    child.once('exit', () => {
      clearTimeout(timer);
      resolveStop();
    });
    child.kill('SIGTERM');
  });
}

export async function startHarness(options: HarnessOptions = {}): Promise<Harness> {
  if (!existsSync(join(ROOT, 'dist/index.html'))) {
    throw new Error('dist/index.html is missing: run `npm run build` before the browser tests.');
  }
  if (!existsSync(CHROMIUM_PATH)) {
    throw new Error(`No Chromium at ${CHROMIUM_PATH}: install it with \`apt-get install -y chromium\`.`);
  }
  mkdirSync(SCREENSHOT_DIR, { recursive: true });

  const tmp = await mkdtemp(join(tmpdir(), 'deckshare-e2e-'));
  const databaseUrl = join(tmp, 'deckshare.db');
  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;

  let output = '';
  const server = spawn(join(ROOT, 'node_modules/.bin/tsx'), ['server/index.ts'], {
    cwd: ROOT,
    env: {
      ...process.env,
      NODE_ENV: 'development',
      PORT: String(port),
      HOST: '127.0.0.1',
      DATABASE_URL: databaseUrl,
      CLIENT_DIST: join(ROOT, 'dist'),
      SEED_DEMO: 'true',
      DEMO_PASSWORD,
      LOG_REQUESTS: 'true',
      PUBLIC_URL: baseUrl,
      ...options.env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  server.stdout?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  server.stderr?.on('data', (chunk: Buffer) => (output += chunk.toString()));
  const serverLog = () => output;

  let context: BrowserContext | undefined;
  const cleanup = async () => {
    await context?.close().catch(() => undefined);
    await stopProcess(server);
    await rm(tmp, { recursive: true, force: true });
  };

  try {
    await waitForHealth(baseUrl, server, serverLog, 45_000);
    context = await chromium.launchPersistentContext(join(tmp, 'profile'), {
      executablePath: CHROMIUM_PATH,
      headless: true,
      args: CHROMIUM_ARGS,
      viewport: options.viewport ?? { width: 1366, height: 900 },
      locale: 'en-US',
      timezoneId: 'UTC',
    });
  } catch (error) {
    await cleanup();
    throw error;
  }

  const pageErrors: string[] = [];
  const watch = (page: Page) => {
    page.on('pageerror', (error) => pageErrors.push(`pageerror: ${error.message}`));
    page.on('console', (msg) => {
      if (msg.type() === 'error') pageErrors.push(`console: ${msg.text()}`);
    });
  };
  context.on('page', watch);
  // A persistent context opens with one page already (not reported by the 'page' event).
  const existing = context.pages()[0];
  if (existing) watch(existing);
  const page = existing ?? (await context.newPage());
  page.setDefaultTimeout(15_000);

  const ctx = context;
  return {
    baseUrl,
    port,
    databaseUrl,
    context: ctx,
    page,
    pageErrors,
    url: (path: string) => `${baseUrl}${path.startsWith('/') ? path : `/${path}`}`,
    async screenshot(name: string, target: Page = page) {
      const file = join(SCREENSHOT_DIR, `${name.replace(/[^a-z0-9._-]+/gi, '-')}.png`);
      // Finite CSS animations (fades of menus, messages, field help) are run to their end first.
      await target.screenshot({ path: file, fullPage: true, animations: 'disabled' });
      return file;
    },
    serverLog,
    stop: cleanup,
  };
}

/** Signs in through the sign-in form and waits until the app has left the sign-in screen. */
export async function signIn(page: Page, baseUrl: string, email: string, password: string = DEMO_PASSWORD): Promise<void> {
  if (!page.url().includes('/sign-in')) await page.goto(`${baseUrl}/sign-in`);
  // the fields by their labels, as a user (and a screen reader) finds them
  await page.getByLabel('E-mail', { exact: true }).fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.locator('button[data-test="sign-in"]').click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

/** The box of an ant-design Select whose combobox has this label (it shows the chosen value). */
export function selectByLabel(page: Page, label: string, scope: Page | Locator = page): Locator {
  return scope.locator('.ant-select', { has: page.getByLabel(label, { exact: true }) });
}

/**
 * Picks an option of an ant-design Select found by its label: clicks the Select box that holds
 * the labelled combobox (the box's shown value lies over the combobox input itself), then the
 * open list's option with this text. `scope` narrows the label's search (a dialog, say).
 */
export async function chooseByLabel(page: Page, label: string, option: string, scope: Page | Locator = page): Promise<void> {
  await selectByLabel(page, label, scope).click();
  await page.locator('.ant-select-dropdown:not(.ant-select-dropdown-hidden) .ant-select-item-option', { hasText: option }).first().click();
}

/** Signs out through the user menu and waits for the sign-in screen. */
export async function signOut(page: Page): Promise<void> {
  await page.locator('[data-test="user-menu"]').click();
  await page.locator('[data-test="sign-out"]').click();
  await page.waitForURL((url) => url.pathname.startsWith('/sign-in'));
}
