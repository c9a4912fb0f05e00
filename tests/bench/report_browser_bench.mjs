// Browser timings of the report (peer of bench_report.cpp, which writes the files):
//   node tests/bench/report_browser_bench.mjs DIR [chromium]
// For DIR/report-shift.html and DIR/report-mix.html (2000 + 2000 points, 201 θ × 15 measures):
//  * open: navigation start to the end of the page's script (window.barrowReport.readyAt,
//    performance.now() there), and the wall time of page.goto + waiting for it, 7 runs each;
//  * redraw: moving the slider to 60 random θ (an 'input' event on the range control), timed
//    (a) to the end of the script and a forced layout, (b) to the second animation frame
//    after it, i.e. until the moved points were painted.
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { launch } from '../report/browser.mjs';

const dir = process.argv[2];
const chromium = process.argv[3] || '/usr/bin/chromium';
if (!dir) { console.error('usage: report_browser_bench.mjs DIR [chromium]'); process.exit(2); }
console.log(`load average: ${(await import('node:os')).loadavg().map((x) => x.toFixed(1)).join(' ')}`);
const browser = await launch(chromium, path.join(dir, 'bench-profile'));
const median = (xs) => { const s = [...xs].sort((a, b) => a - b); return s[Math.floor(s.length / 2)]; };
const max = (xs) => Math.max(...xs);
const min = (xs) => Math.min(...xs);

for (const family of ['shift', 'mix']) {
  const url = pathToFileURL(path.join(dir, `report-${family}.html`)).href;
  const ready = [], wall = [];
  let page;
  for (let run = 0; run < 7; ++run) {
    if (page) await page.close();
    page = await browser.newPage();
    await page.setViewport({ width: 1360, height: 900 });
    await page.setRequestInterception(true);
    page.on('request', (r) => (r.url() === url ? r.continue() : (console.error('request: ' + r.url()), process.exit(1))));
    page.on('pageerror', (e) => { console.error('page error: ' + e.message); process.exit(1); });
    const t0 = performance.now();
    await page.goto(url, { waitUntil: 'load' });
    await page.waitForFunction('window.barrowReport && window.barrowReport.ready');
    wall.push(performance.now() - t0);
    ready.push(await page.evaluate(() => window.barrowReport.readyAt));
  }
  const n = await page.evaluate(() => (document.querySelector('#cloud-fig path.cloud-a').getAttribute('d').match(/M/g) || []).length);
  const rows = await page.evaluate(() => +document.getElementById('theta').max + 1);
  const script = [], frame = [];
  let seed = 12345;
  const next = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
  for (let k = 0; k < 60; ++k) {
    const idx = Math.floor(next() * rows);
    const t = await page.evaluate(async (idx) => {
      const s = document.getElementById('theta');
      const t0 = performance.now();
      s.value = idx;
      s.dispatchEvent(new Event('input', { bubbles: true }));
      document.querySelector('#cloud-fig .cloud-a').getBoundingClientRect();
      const t1 = performance.now();
      await new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r)));
      return [t1 - t0, performance.now() - t0];
    }, idx);
    script.push(t[0]);
    frame.push(t[1]);
  }
  console.log(`${family}: A_θ ${n} markers, ${rows} θ rows`);
  const stats = (xs, d) => `median ${median(xs).toFixed(d)}, min ${min(xs).toFixed(d)}, max ${max(xs).toFixed(d)} ms`;
  console.log(`  open, navigation start to ready: ${stats(ready, 0)}; goto + ready, wall: ${stats(wall, 0)}`);
  console.log(`  slider redraw, script + layout: ${stats(script, 1)}; to the painted frame: ${stats(frame, 1)}`);
  await page.close();
  page = undefined;
}
await browser.close();
