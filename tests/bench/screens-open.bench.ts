import type { Page } from '@playwright/test';
import { performance } from 'node:perf_hooks';
import type { Database } from '../../server/db/database';
import { PartEntity } from '../../server/master-data/part.entity';
import { openBrowserBench } from './browser-bench';

const OPEN_TIMEOUT_MS = 180_000;
/** No request of the screen's own in flight for this long: its data is in. */
const QUIET_MS = 500;
/** The Horizon has a printout of its own. */
const NOT_HERE = new Set(['Horizon']);
/** The server-sent events stream stays open for as long as the page does. */
const isOwnRequest = (url: string) => url.includes('/api/') && !url.includes('/api/events');

interface ScreenFigures {
  ms: number;
  nodes: number;
  heapMb: number;
}

/**
 * Opens every screen of the navigation (signed in as an admin, so all are open) and a part, a
 * supplier and a BOM page on a plant already written to `db`, and prints for each the time from the
 * click (or the address typed) until its data was in and drawn, the page's DOM size and the JS heap.
 * A printout for a person to read, never a pass/fail.
 */
export async function printScreensOpen(db: Database): Promise<void> {
  const bought = await db.dataSource
    .getRepository(PartEntity)
    .createQueryBuilder('part')
    .where('part.supplierCode IS NOT NULL')
    .orderBy('part.partNumber')
    .getOneOrFail();
  const model = await db.dataSource
    .getRepository(PartEntity)
    .findOneOrFail({ where: { source: 'end_item' }, order: { partNumber: 'ASC' } });
  const bench = await openBrowserBench(db, 'admin');
  const { base, page } = bench;
  try {
    // Plain statements only: tsx names arrow functions held in a const with a helper the page lacks.
    await page.addInitScript(() => {
      performance.setResourceTimingBufferSize(100_000);
      const win = window as unknown as {
        benchLongTaskEnds: number[];
        benchLongTasks: PerformanceObserver;
        benchTakeLongTasks: () => void;
        benchBusyEnds: number[];
      };
      win.benchLongTaskEnds = [];
      win.benchLongTasks = new PerformanceObserver((list) => {
        for (const entry of list.getEntries()) win.benchLongTaskEnds.push(entry.startTime + entry.duration);
      });
      win.benchLongTasks.observe({ type: 'longtask', buffered: true });
      // A screen that works something out off the main thread (the Build sequence's line risk) is
      // aria-busy meanwhile: it is drawn when that ends.
      win.benchBusyEnds = [];
      new MutationObserver((records) => {
        for (const record of records) {
          const target = record.target as Element;
          if (record.oldValue === 'true' && target.getAttribute('aria-busy') !== 'true') {
            win.benchBusyEnds.push(performance.now());
          }
        }
      }).observe(document, {
        subtree: true,
        attributes: true,
        attributeFilter: ['aria-busy'],
        attributeOldValue: true,
      });
      win.benchTakeLongTasks = () => {
        for (const entry of win.benchLongTasks.takeRecords())
          win.benchLongTaskEnds.push(entry.startTime + entry.duration);
      };
    });
    const cdp = await page.context().newCDPSession(page);
    await cdp.send('Performance.enable');
    const tracker = trackRequests(page);

    await bench.signIn();
    // The Overview's first line risk starts the worker; let it settle so each screen is timed alone.
    await tracker.quiet(0);

    const figures = async (since: number, pageStart: number): Promise<ScreenFigures> => {
      await tracker.quiet(since);
      await page.waitForFunction(() => !document.querySelector('[aria-busy="true"]'), null, {
        timeout: OPEN_TIMEOUT_MS,
      });
      // Data in and drawn: the last answer it asked for (its data, its code), the last long task it
      // caused, or the end of its busy state.
      const ready = await page.evaluate(
        ({ start }) => {
          const win = window as unknown as {
            benchLongTaskEnds: number[];
            benchTakeLongTasks: () => void;
            benchBusyEnds: number[];
          };
          // Entries not yet handed to the observer's callback (it runs later, at low priority).
          win.benchTakeLongTasks();
          const answers = performance
            .getEntriesByType('resource')
            .filter((entry) => entry.startTime >= start && !entry.name.includes('/api/events'))
            .map((entry) => (entry as PerformanceResourceTiming).responseEnd);
          const ends = [...win.benchLongTaskEnds, ...win.benchBusyEnds].filter((end) => end >= start);
          return Math.max(start, ...answers, ...ends) - start;
        },
        { start: pageStart },
      );
      await cdp.send('HeapProfiler.collectGarbage');
      const { metrics } = await cdp.send('Performance.getMetrics');
      const metric = (name: string) => metrics.find((entry) => entry.name === name)?.value ?? 0;
      const nodes = await page.evaluate(() => document.getElementsByTagName('*').length);
      return { ms: ready, nodes, heapMb: metric('JSHeapUsedSize') / 1e6 };
    };

    const labels = (await page.getByRole('navigation', { name: 'Main' }).getByRole('link').allTextContents())
      .map((text) => text.trim())
      .filter((label) => !NOT_HERE.has(label));
    // The Overview last, clicked from the screen before it.
    const order = [...labels.filter((label) => label !== 'Overview'), 'Overview'];
    const rows: [string, ScreenFigures | null][] = [];
    for (const label of order) {
      const since = performance.now();
      const pageStart = await page.evaluate((name) => {
        const link = [...document.querySelectorAll<HTMLAnchorElement>('nav[aria-label="Main"] a')].find(
          (anchor) => anchor.textContent?.trim() === name,
        );
        const start = performance.now();
        link?.click();
        return start;
      }, label);
      rows.push([label, await figures(since, pageStart).catch(noFigures(label))]);
    }
    const typed: [string, string][] = [
      [`Part page (${bought.partNumber})`, `/parts/${encodeURIComponent(bought.partNumber)}`],
      [`Supplier page (${bought.supplierCode})`, `/suppliers/${encodeURIComponent(bought.supplierCode ?? '')}`],
      [`BOM page (${model.partNumber})`, `/bom/${encodeURIComponent(model.partNumber)}`],
    ];
    for (const [label, path] of typed) {
      const since = performance.now();
      await page.goto(`${base}${path}`);
      // A typed address loads the whole app: timed from the navigation's start (page time 0).
      rows.push([`${label}, typed`, await figures(since, 0).catch(noFigures(label))]);
    }

    console.log('Every screen (Chromium, 1440 px, admin), click to data in and drawn | DOM nodes | JS heap:');
    for (const [label, row] of rows) {
      console.log(
        row
          ? `  ${label.padEnd(36)} ${`${row.ms.toFixed(0)} ms`.padStart(9)} | ${String(row.nodes).padStart(7)} nodes | ${row.heapMb.toFixed(0).padStart(4)} MB`
          : `  ${label.padEnd(36)} no figures (see above)`,
      );
    }
  } finally {
    await bench.close();
  }
}

/** Says why a screen gave no figures (it is left out of the table), and goes on with the next. */
function noFigures(label: string): (error: unknown) => null {
  return (error) => {
    console.log(`  ${label}: ${error instanceof Error ? error.message : String(error)}`);
    return null;
  };
}

/** Counts the page's API requests in flight, by when they started (Node's clock). */
function trackRequests(page: Page): { quiet: (since: number) => Promise<void> } {
  const started = new Map<object, number>();
  let lastSettled = performance.now();
  page.on('request', (request) => {
    if (isOwnRequest(request.url())) started.set(request, performance.now());
  });
  const settle = (request: object) => {
    if (started.delete(request)) lastSettled = performance.now();
  };
  page.on('requestfinished', settle);
  page.on('requestfailed', settle);
  return {
    async quiet(since: number) {
      const deadline = performance.now() + OPEN_TIMEOUT_MS;
      for (;;) {
        const pending = [...started.values()].some((at) => at >= since);
        const settledFor = performance.now() - Math.max(lastSettled, since);
        if (!pending && settledFor >= QUIET_MS) return;
        if (performance.now() > deadline) throw new Error('screen not quiet');
        await new Promise((resolve) => setTimeout(resolve, 50));
      }
    },
  };
}
