// The builder in Chromium (playwright-core with the system's /usr/bin/chromium, as the browser tests
// launch it) on the production build: JavaScript weight before a view tab is opened (uncompressed and
// as sent), the HTML, and first contentful paint with a cold browser cache, for the demo session (20
// runs) and the 200-run session; My runs and the crew card on a phone-sized page; then the time from
// an edited departure's Enter key to the re-checked findings in the DOM on the 200-run session.
// A benchmark, not a test: figures are printed, nothing is asserted. BENCH_PORT moves the server.
import { chromium, type Browser } from 'playwright-core';
import { loadAverage, median, printGoals, signIn, startBenchServer, type BenchServer } from './bench-server';

const PORT = Number(process.env.BENCH_PORT ?? 3630) + 2;
const COLD_VISITS = Number(process.env.BENCH_VISITS ?? 5);
const EDITS = 5;

type PageFigures = { name: string; jsKiB: number; jsSentKiB: number; scripts: number; htmlKiB: number; htmlSentKiB: number; fcpMs: number[] };

const kib = (bytes: number) => Math.round((bytes / 1024) * 10) / 10;

async function coldVisits(browser: Browser, base: string, cookie: string, name: string, path: string, ready: string, phone: boolean): Promise<PageFigures> {
  const [cookieName, ...rest] = cookie.split('=');
  const figures: PageFigures = { name, jsKiB: 0, jsSentKiB: 0, scripts: 0, htmlKiB: 0, htmlSentKiB: 0, fcpMs: [] };
  for (let i = 0; i < COLD_VISITS + 1; i++) {
    // A fresh context each visit: an empty cache, as on a first visit.
    const context = await browser.newContext({ viewport: phone ? { width: 390, height: 844 } : { width: 1366, height: 800 } });
    await context.addCookies([{ name: cookieName!, value: rest.join('='), url: base }]);
    const page = await context.newPage();
    await page.goto(`${base}${path}`, { waitUntil: 'load' });
    await page.waitForSelector(ready);
    await page.waitForLoadState('networkidle');
    const measured = await page.evaluate(() => {
      const nav = performance.getEntriesByType('navigation')[0] as PerformanceNavigationTiming;
      const scripts = (performance.getEntriesByType('resource') as PerformanceResourceTiming[]).filter((r) => r.initiatorType === 'script' || r.name.endsWith('.js'));
      const paint = performance.getEntriesByName('first-contentful-paint')[0];
      return {
        fcp: paint?.startTime ?? -1,
        html: nav.decodedBodySize,
        htmlSent: nav.encodedBodySize,
        js: scripts.reduce((n, r) => n + r.decodedBodySize, 0),
        jsSent: scripts.reduce((n, r) => n + r.encodedBodySize, 0),
        count: scripts.length,
      };
    });
    if (i > 0) {
      // The first visit warms the server (its caches and compiled modules), not the browser.
      figures.fcpMs.push(Math.round(measured.fcp));
      Object.assign(figures, { jsKiB: kib(measured.js), jsSentKiB: kib(measured.jsSent), scripts: measured.count, htmlKiB: kib(measured.html), htmlSentKiB: kib(measured.htmlSent) });
    }
    await context.close();
  }
  return figures;
}

/** Edits EDITS departures of the session and times each from the Enter key to the re-checked findings. */
async function editTimes(browser: Browser, base: string, cookie: string, path: string): Promise<{ editMs: number[]; answeredMs: number[] }> {
  const [cookieName, ...rest] = cookie.split('=');
  const context = await browser.newContext({ viewport: { width: 1366, height: 800 } });
  await context.addCookies([{ name: cookieName!, value: rest.join('='), url: base }]);
  const page = await context.newPage();
  await page.goto(`${base}${path}`);
  await page.waitForSelector('[data-testid="check-status"]');
  await page.waitForLoadState('networkidle');
  const editMs: number[] = [];
  const answeredMs: number[] = [];
  for (let i = 0; i < EDITS; i++) {
    const input = page.getByTestId('run-row').nth(5 + i).getByTestId('run-depart');
    const current = await input.inputValue();
    const [h, m] = current.split(':').map(Number);
    await input.fill(`${String(h).padStart(2, '0')}:${String(((m ?? 0) + 7) % 60).padStart(2, '0')}`);
    // Timed inside the page: from the Enter key to the check status's next revision in the DOM.
    const ms = await input.evaluate(
      (el) =>
        new Promise<number>((resolve) => {
          const status = document.querySelector('[data-testid="check-status"]')!;
          const revision = status.getAttribute('data-revision');
          const started = performance.now();
          const observer = new MutationObserver(() => {
            if (status.getAttribute('data-revision') !== revision) {
              observer.disconnect();
              resolve(Math.round(performance.now() - started));
            }
          });
          observer.observe(status, { attributes: true });
          el.dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter', bubbles: true }));
        }),
    );
    editMs.push(ms);
    const answered = (await page.getByTestId('check-status').textContent())?.match(/answered in (\d+) ms/);
    if (answered) answeredMs.push(Number(answered[1]));
  }
  await context.close();
  return { editMs, answeredMs };
}

let app: BenchServer | undefined;
let browser: Browser | undefined;
try {
  app = await startBenchServer(PORT);
  const { base } = app;
  const planner = await signIn(base, 'planner@fishplate.example');
  const operator = await signIn(base, 'operator@fishplate.example');
  browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  const builder = (id: string) => `/railways/${app!.railwayId}/sessions/${id}`;
  const loadBefore = loadAverage();
  const pages = [
    await coldVisits(browser, base, planner, 'builder, demo session (20 runs)', builder(app.demoId), '[data-testid="train-graph"]', false),
    await coldVisits(browser, base, planner, 'builder, 200-run session', builder(app.largeId), '[data-testid="train-graph"]', false),
    await coldVisits(browser, base, operator, 'My runs (phone)', '/my-runs', '[data-testid="my-session"]', true),
    await coldVisits(browser, base, operator, 'crew card, demo session (phone)', `/my-runs/${app.demoId}/card`, '[data-testid="crew-card"]', true),
  ];
  const edits = await editTimes(browser, base, planner, builder(app.largeId));

  console.log(`\nChromium, cold cache per visit, medians of ${COLD_VISITS} after one warm-up visit`);
  console.log(`load average (1, 5, 15 min) before: ${loadBefore}, after: ${loadAverage()}\n`);
  console.log('| page | JS before a view tab is opened, KiB (sent) | scripts | HTML KiB (sent) | first contentful paint ms (median, range) |');
  console.log('|---|---|---|---|---|');
  for (const p of pages) {
    console.log(
      `| ${p.name} | ${p.jsKiB} (${p.jsSentKiB}) | ${p.scripts} | ${p.htmlKiB} (${p.htmlSentKiB}) | ${median(p.fcpMs)} (${Math.min(...p.fcpMs)}–${Math.max(...p.fcpMs)}) |`,
    );
  }
  const [demo, large, myRuns, card] = pages as [PageFigures, PageFigures, PageFigures, PageFigures];
  const js = (p: PageFigures) => `${p.jsKiB} KiB (${p.jsSentKiB} KiB sent)`;
  printGoals(
    `README table, in Chromium (cold cache, medians of ${COLD_VISITS})`,
    [
      { what: 'builder page HTML, 20 runs (decoded)', goal: '≤ 60 KB', figure: `${demo.htmlKiB} KiB (${demo.htmlSentKiB} KiB sent)`, met: demo.htmlKiB * 1024 <= 60_000 },
      { what: 'builder page HTML, 200 runs (decoded)', goal: 'grows slowly', figure: `${large.htmlKiB} KiB (${large.htmlSentKiB} KiB sent)`, met: null },
      { what: 'builder JavaScript before a view tab is opened', goal: '≤ 450 KiB', figure: js(demo), met: demo.jsKiB <= 450 },
      {
        what: 'builder first contentful paint, cold (demo / 200 runs)',
        goal: '< 0.8 s',
        figure: `${median(demo.fcpMs)} / ${median(large.fcpMs)} ms`,
        met: median(demo.fcpMs) < 800 && median(large.fcpMs) < 800,
      },
      { what: 'My runs JavaScript (phone)', goal: '≤ 250 KiB', figure: js(myRuns), met: myRuns.jsKiB <= 250 },
      { what: 'crew card JavaScript (phone)', goal: '≤ 250 KiB', figure: js(card), met: card.jsKiB <= 250 },
      {
        what: 'edit → re-checked findings, 200 runs',
        goal: '< 300 ms (the builder section)',
        figure: `${median(edits.editMs)} ms; round trip ${edits.answeredMs.length ? `${median(edits.answeredMs)} ms` : 'not shown'}`,
        met: median(edits.editMs) < 300,
      },
    ],
    loadAverage(),
  );
  console.log(
    `\n200-run session, edit a departure → re-checked findings in the DOM: median ${median(edits.editMs)} ms (${edits.editMs.join(', ')}); ` +
      `of which the change's round trip ${edits.answeredMs.length ? `${median(edits.answeredMs)} ms (${edits.answeredMs.join(', ')})` : 'not shown'}`,
  );
} finally {
  await browser?.close();
  app?.stop();
}
