import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { listeningServer } from './test-app';

const CHROMIUM_ARGS = [
  '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync',
];

/** One Debian Chromium context per person (its own profile folder, so cookies never mix). */
export async function openBrowser(opts: { width?: number; height?: number; timezoneId?: string } = {}): Promise<{ context: BrowserContext; page: Page; close: () => Promise<void> }> {
  const profile = fs.mkdtempSync(path.join(os.tmpdir(), 'burrowline-e2e-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: CHROMIUM_ARGS,
    viewport: { width: opts.width ?? 1280, height: opts.height ?? 900 },
    ...(opts.timezoneId ? { timezoneId: opts.timezoneId } : {}),
  });
  const page = context.pages()[0] ?? (await context.newPage());
  return {
    context,
    page,
    close: async () => {
      await context.close();
      fs.rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Page errors a person would see as a broken screen (network 401s while signed out are expected). */
export function collectPageErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('pageerror', (error) => errors.push(String(error)));
  return errors;
}

/** Signs in through the sign-in screen as a person would, and waits for Commons. */
export async function signInAt(page: Page, baseUrl: string, email: string, password: string): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('heading', { name: 'Commons', level: 1 }).waitFor();
}

/** How many pixels the page scrolls sideways (0 when it fits the width, as on a phone it must). */
export const sidewaysScroll = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);

/**
 * The app a browser test file drives: started on a free port before its tests and closed after them.
 * `signIn` signs in at it with the given password (the test coops' by default at the call site).
 */
export function browserTestApp(password: string) {
  let server: Awaited<ReturnType<typeof listeningServer>> | null = null;
  beforeAll(async () => {
    server = await listeningServer();
  });
  afterAll(async () => {
    await server?.close();
  });
  const live = () => {
    if (!server) throw new Error('The app starts in beforeAll; use it inside a test');
    return server;
  };
  return {
    get url() {
      return live().url;
    },
    signIn: (page: Page, email: string, withPassword = password) => signInAt(page, live().url, email, withPassword),
  };
}
