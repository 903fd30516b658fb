// Largest contentful paint in headless Chromium on loopback, read from the page's own PerformanceObserver.
import { openBrowser } from '../../../tests/support/browser';

export interface LcpResult {
  path: string;
  /** Median over loads with an empty HTTP cache (a first visit), the browser itself already running. */
  coldMedianMs: number;
  /** Median over loads with scripts, styles and fonts cached (a later visit). */
  warmMedianMs: number;
  coldSamplesMs: number[];
  warmSamplesMs: number[];
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

export async function measureLcp(baseUrl: string, path: string, opts: { sessionCookie?: { name: string; value: string }; loads?: number } = {}): Promise<LcpResult> {
  const browser = await openBrowser();
  try {
    if (opts.sessionCookie) await browser.context.addCookies([{ ...opts.sessionCookie, url: baseUrl }]);
    const cdp = await browser.context.newCDPSession(browser.page);
    // The browser's own start-up (first renderer, first connection) is not the page's: one throwaway load.
    await browser.page.goto(new URL('/api/health', baseUrl).toString());
    const load = async (): Promise<number> => {
      await browser.page.goto(new URL(path, baseUrl).toString(), { waitUntil: 'networkidle' });
      const lcp = await browser.page.evaluate(
        () =>
          new Promise<number>((resolve) => {
            let last = 0;
            new PerformanceObserver((list) => {
              for (const entry of list.getEntries()) last = entry.startTime;
            }).observe({ type: 'largest-contentful-paint', buffered: true });
            setTimeout(() => resolve(last), 250);
          }),
      );
      return Math.round(lcp);
    };
    const cold: number[] = [];
    const warm: number[] = [];
    for (let i = 0; i < (opts.loads ?? 5); i++) {
      await cdp.send('Network.clearBrowserCache');
      cold.push(await load());
    }
    for (let i = 0; i < (opts.loads ?? 5); i++) warm.push(await load());
    return { path, coldMedianMs: median(cold), warmMedianMs: median(warm), coldSamplesMs: cold, warmSamplesMs: warm };
  } finally {
    await browser.close();
  }
}
