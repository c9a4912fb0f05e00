// Browser timings of the report (peer of bench_report.cpp, which writes the files):
//   node tests/bench/report_browser_bench.mjs DIR [chromium]
// For DIR/report-shift.html and DIR/report-mix.html (2000 + 2000 points, 201 θ × 15 measures):
//  * open: navigation start to the end of the page's script (window.barrowReport.readyAt,
//    performance.now() there), and the wall time of page.goto + waiting for it, 5 runs each;
//  * redraw: moving the slider to 40 random θ (an 'input' event on the range control), timed
//    (a) to the end of the script and a forced layout, (b) to the second animation frame
//    after it, i.e. until the moved points were painted.
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { launch } from '../report/browser.mjs';

const dir = process.argv[2];
const chromium = process.argv[3] || '/usr/bin/chromium';
if (!dir) { console.error('usage: report_browser_bench.mjs DIR [chromium]'); process.exit(2); }
const browser = await launch(chromium, path.join(dir, 'bench-profile'));
const median = (xs) => { const s = [...xs].sort((a, b) => a - b); return s[Math.floor(s.length / 2)]; };
const max = (xs) => Math.max(...xs);

for (const family of ['shift', 'mix']) {
  const url = pathToFileURL(path.join(dir, `report-${family}.html`)).href;
  const ready = [], wall = [];
  let page;
  for (let run = 0; run < 5; ++run) {
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
  const n = await page.evaluate(() => document.querySelectorAll('#cloud-fig .cloud-a circle').length);
  const rows = await page.evaluate(() => +document.getElementById('theta').max + 1);
  const script = [], frame = [];
  let seed = 12345;
  const next = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
  for (let k = 0; k < 40; ++k) {
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
  console.log(`  open: ready at ${median(ready).toFixed(0)} ms after navigation start (median of 5, max ${max(ready).toFixed(0)}), ` +
              `goto+ready wall ${median(wall).toFixed(0)} ms (max ${max(wall).toFixed(0)})`);
  console.log(`  slider redraw: script+layout median ${median(script).toFixed(1)} ms (max ${max(script).toFixed(1)}), ` +
              `to painted frame median ${median(frame).toFixed(1)} ms (max ${max(frame).toFixed(1)})`);
  await page.close();
  page = undefined;
}
await browser.close();
