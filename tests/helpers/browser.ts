/**
 * Render an HTML string in Debian's Chromium (headless, via playwright-core) and report what the
 * page did: console errors, page errors, network requests other than the file itself, dialogs,
 * SVG paths drawn, plus a screenshot. Used by the browser check of the HTML report.
 * Chromium comes from the OS (`apt-get install chromium`), not from a playwright download.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium } from 'playwright-core';

/** Where the browser check expects Debian's Chromium. */
export const CHROMIUM_PATH = '/usr/bin/chromium';

/** What a page did when loaded from a file:// URL. */
export interface RenderResult {
  /** Console messages of type `error` (CSP violations land here too). */
  consoleErrors: string[];
  /** Uncaught exceptions thrown by page scripts. */
  pageErrors: string[];
  /** Every request URL other than the report file itself (blocked, so nothing leaves the machine). */
  networkRequests: string[];
  /** Messages of any alert/confirm/prompt dialog that opened. */
  dialogs: string[];
  /** Number of `svg path` elements with a non-empty `d` attribute. */
  svgPathCount: number;
  /** Number of `svg` elements. */
  svgCount: number;
  /** Counts of elements that a report must never contain. */
  forbiddenElementCount: { script: number; img: number; iframe: number; object: number; embed: number };
  /** document.title as the browser parsed it. */
  documentTitle: string;
  /** The page's visible text (body.innerText). */
  bodyText: string;
  /** PNG of the full page, in `outDir`. */
  screenshotPath: string;
  /** The page printed by Chromium (`page.pdf`, print media, CSS page size), when asked for; in `outDir`. */
  pdfPath: string | null;
  screenshotBytes: number;
  /** Folder holding the HTML file and the screenshot (kept for inspection). */
  outDir: string;
}

/** Throws with install instructions when Debian's Chromium is missing. */
export function requireChromium(): void {
  if (!existsSync(CHROMIUM_PATH)) {
    throw new Error(
      `${CHROMIUM_PATH} not found: the HTML report browser check needs Debian's Chromium. ` +
        'Install it with `apt-get update && apt-get install -y chromium` (CI does this in .ci/run).',
    );
  }
}

/** Write `html` to a fresh temp folder, open it in headless Chromium and report what happened. */
export async function renderInChromium(html: string, opts: { timeoutMs?: number; pdf?: boolean } = {}): Promise<RenderResult> {
  requireChromium();
  const outDir = mkdtempSync(join(tmpdir(), 'tauplan-browser-'));
  const profileDir = mkdtempSync(join(tmpdir(), 'tauplan-chromium-profile-'));
  const file = join(outDir, 'report.html');
  writeFileSync(file, html, 'utf8');
  const fileUrl = pathToFileURL(file).href;

  const consoleErrors: string[] = [];
  const pageErrors: string[] = [];
  const networkRequests: string[] = [];
  const dialogs: string[] = [];

  // launchPersistentContext owns --user-data-dir, so the fresh profile goes in as its first argument.
  const context = await chromium.launchPersistentContext(profileDir, {
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
    viewport: { width: 1100, height: 900 },
    offline: true,
    timeout: opts.timeoutMs ?? 30_000,
  });
  try {
    // Anything that is not the report file is recorded and refused.
    await context.route(
      (url) => url.href !== fileUrl,
      async (route) => {
        networkRequests.push(route.request().url());
        await route.abort();
      },
    );
    const page = context.pages()[0] ?? (await context.newPage());
    page.on('console', (m) => {
      if (m.type() === 'error') consoleErrors.push(m.text());
    });
    page.on('pageerror', (e) => pageErrors.push(String(e)));
    page.on('request', (r) => {
      if (r.url() !== fileUrl && !networkRequests.includes(r.url())) networkRequests.push(r.url());
    });
    page.on('dialog', async (d) => {
      dialogs.push(`${d.type()}: ${d.message()}`);
      await d.dismiss();
    });

    await page.goto(fileUrl, { waitUntil: 'load', timeout: opts.timeoutMs ?? 30_000 });
    await page.waitForTimeout(200); // let late console messages arrive

    // A string, not a function: transpilers (tsx keepNames) may wrap functions in helpers the page lacks.
    const counts = (await page.evaluate(`(() => {
      const paths = Array.from(document.querySelectorAll('svg path')).filter((p) => (p.getAttribute('d') || '').trim() !== '');
      const q = (sel) => document.querySelectorAll(sel).length;
      return {
        svgPathCount: paths.length,
        svgCount: q('svg'),
        forbidden: { script: q('script'), img: q('img'), iframe: q('iframe'), object: q('object'), embed: q('embed') },
        title: document.title,
        text: document.body.innerText,
      };
    })()`)) as {
      svgPathCount: number;
      svgCount: number;
      forbidden: RenderResult['forbiddenElementCount'];
      title: string;
      text: string;
    };
    const screenshotPath = join(outDir, 'report.png');
    await page.screenshot({ path: screenshotPath, fullPage: true });
    let pdfPath: string | null = null;
    if (opts.pdf === true) {
      pdfPath = join(outDir, 'report.pdf');
      // preferCSSPageSize: the report's own @page rule (A4 landscape) sets the paper.
      await page.pdf({ path: pdfPath, preferCSSPageSize: true, printBackground: false });
    }
    return {
      pdfPath,
      consoleErrors,
      pageErrors,
      networkRequests,
      dialogs,
      svgPathCount: counts.svgPathCount,
      svgCount: counts.svgCount,
      forbiddenElementCount: counts.forbidden,
      documentTitle: counts.title,
      bodyText: counts.text,
      screenshotPath,
      screenshotBytes: statSync(screenshotPath).size,
      outDir,
    };
  } finally {
    await context.close();
    rmSync(profileDir, { recursive: true, force: true });
  }
}

/** Where the printed-report check expects poppler's pdftotext (`apt-get install poppler-utils`). */
export const PDFTOTEXT_PATH = '/usr/bin/pdftotext';

/** The text of a PDF in reading order (pdftotext), and its page count. Fails, not skips, without poppler-utils. */
export function pdfText(pdfPath: string): { text: string; pages: number } {
  if (!existsSync(PDFTOTEXT_PATH)) {
    throw new Error(`${PDFTOTEXT_PATH} not found: the printed-report check needs poppler-utils (\`apt-get install -y poppler-utils\`; CI does this in .ci/run).`);
  }
  const text = execFileSync(PDFTOTEXT_PATH, ['-enc', 'UTF-8', pdfPath, '-'], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  return { text, pages: text.split('\f').length - 1 };
}
