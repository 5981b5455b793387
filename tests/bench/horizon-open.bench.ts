import { performance } from 'node:perf_hooks';
import type { Database } from '../../server/db/database';
import { bumpPlanningVersion } from '../../server/settings/versions';
import { openBrowserBench } from './browser-bench';

const OPEN_TIMEOUT_MS = 180_000;

/**
 * Opens the Horizon screen of a plant already written to `db` in Chromium and prints how long it
 * took until the first row showed, the page's DOM size, and the main-thread work (long tasks) a
 * planning change caused. A printout for a person to read, never a pass/fail.
 */
export async function printHorizonOpen(db: Database): Promise<void> {
  const bench = await openBrowserBench(db, 'buyer');
  const { base, page } = bench;
  try {
    await bench.signIn();

    // First with the server's plan cache cold (the first visit after a change), then again warm.
    const firstRow = page.locator('.horizon-table .el-table__body-wrapper button').first();
    const isTablePage = (url: string) => url.includes('/api/demand/table?');
    // From the Overview once its figures are in, so the Horizon is timed alone: on a large plant the
    // Overview's first line risk is a figure of its own (printed above as GET /api/line-risk, first).
    const openMs = async (): Promise<{ rows: number; answer: number } | null> => {
      const overview = page.waitForResponse((response) => response.url().endsWith('/api/overview'), {
        timeout: OPEN_TIMEOUT_MS,
      });
      await page.goto(`${base}/`);
      await overview;
      await page.getByRole('navigation').waitFor();
      const start = performance.now();
      const answered = page
        .waitForResponse((response) => isTablePage(response.url()), { timeout: OPEN_TIMEOUT_MS })
        .then(() => performance.now() - start);
      await page.getByRole('navigation').getByRole('link', { name: 'Horizon' }).click();
      return firstRow
        .waitFor({ timeout: OPEN_TIMEOUT_MS })
        .then(async () => ({ rows: performance.now() - start, answer: await answered }))
        .catch(() => null);
    };
    const cold = await openMs();
    const warm = await openMs();
    if (cold === null || warm === null) {
      console.log(`Horizon open (Chromium): no row within ${OPEN_TIMEOUT_MS / 1000} s`);
      return;
    }
    const nodes = await page.evaluate(() => document.getElementsByTagName('*').length);
    const count = await page.locator('.horizon-view__count').textContent();
    console.log(
      `Horizon open (Chromium, 1440 px), click to first rows: ${cold.rows.toFixed(0)} ms with the server's plan cache cold, ` +
        `${warm.rows.toFixed(0)} ms warm (the table page answered after ${cold.answer.toFixed(0)} / ${warm.answer.toFixed(0)} ms); ` +
        `${nodes} DOM nodes; ${count?.trim()}`,
    );

    // Scrolling the table: frames drawn while its body scrolls down and back for two seconds. Sent as
    // text: tsx would wrap a named function in a helper the page lacks.
    const scrolling = await page.evaluate<{ frames: number; longest: number; seconds: number; range: number }>(`
      new Promise((resolve) => {
        const body = document.querySelector('.horizon-table .el-table__body-wrapper .el-scrollbar__wrap');
        const frames = [];
        const started = performance.now();
        const step = (now) => {
          frames.push(now);
          if (body) body.scrollTop = (frames.length % 60) * 12;
          if (now - started < 2000) return requestAnimationFrame(step);
          let longest = 0;
          for (let index = 1; index < frames.length; index += 1) longest = Math.max(longest, frames[index] - frames[index - 1]);
          resolve({ frames: frames.length, longest, seconds: (now - started) / 1000, range: body ? body.scrollHeight - body.clientHeight : 0 });
        };
        requestAnimationFrame(step);
      })`);
    console.log(
      `  scrolling the table: ${(scrolling.frames / scrolling.seconds).toFixed(0)} frames a second, ` +
        `the longest frame ${scrolling.longest.toFixed(0)} ms (its body scrolls over ${scrolling.range} px)`,
    );

    // Main-thread work of one planning change: long tasks (> 50 ms) from the notice until the
    // refreshed figures are in.
    await page.evaluate(() => {
      const win = window as unknown as { benchLongTasks: number };
      win.benchLongTasks = 0;
      new PerformanceObserver((list) => {
        for (const entry of list.getEntries()) win.benchLongTasks += entry.duration;
      }).observe({ type: 'longtask' });
    });
    const refreshed = page.waitForResponse((response) => isTablePage(response.url()), {
      timeout: OPEN_TIMEOUT_MS,
    });
    const changed = performance.now();
    await db.write((manager) => bumpPlanningVersion(manager));
    await refreshed;
    await page.waitForTimeout(1500);
    const longTasks = await page.evaluate(() => (window as unknown as { benchLongTasks: number }).benchLongTasks);
    console.log(
      `  a planning change: new demand fetched after ${(performance.now() - changed - 1500).toFixed(0)} ms or less, ` +
        `${longTasks.toFixed(0)} ms of long tasks on the main thread`,
    );
  } finally {
    await bench.close();
  }
}
