// Browser tests of the HTML report: each report is written by the real barrow-cli, opened
// from disk in the system Chromium (puppeteer-core, no browser download) with every network
// request refused, and checked against what barrow-cli sweep / findings / measure print and
// against the engine's own family map (barrow_family_points). Any request other than the
// file itself, any console error, uncaught exception or dialog fails the run.
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { launch } from './browser.mjs';

const opt = {};
for (let k = 2; k < process.argv.length; k += 2) opt[process.argv[k].replace(/^--/, '')] = process.argv[k + 1];
for (const need of ['cli', 'family-points', 'chromium', 'work'])
  if (!opt[need]) { console.error(`report_browser_test: missing --${need}`); process.exit(2); }
fs.mkdirSync(opt.work, { recursive: true });
const work = (f) => path.join(opt.work, f);

let failures = 0, checks = 0;
function check(ok, what) { ++checks; if (!ok) { ++failures; console.error('FAIL: ' + what); } }
function near(a, b, tol) { return Math.abs(a - b) <= tol * Math.max(1, Math.abs(a), Math.abs(b)); }

// ---- inputs ----------------------------------------------------------------------------------
// Invented scenario: a ring of sensors (A) against a skewed cluster (B), generated from a fixed
// linear congruential sequence so the files are the same on every machine.
function lcg(seed) { let s = seed >>> 0; return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 4294967296); }
function writeCloud(file, pts) { fs.writeFileSync(work(file), 'x,y,w\n' + pts.map((p) => p.join(',')).join('\n') + '\n'); return work(file); }
const r1 = lcg(7), r2 = lcg(8);
const aFile = writeCloud('ring.csv', Array.from({ length: 40 }, (_, i) => {
  const t = 2 * Math.PI * i / 40, rad = 1 + 0.15 * (r1() - 0.5);
  return [rad * Math.cos(t), rad * Math.sin(t), 0.5 + r1()];
}));
const bFile = writeCloud('cluster.csv', Array.from({ length: 30 }, () => [0.9 + 0.5 * (r2() - 0.5), 0.3 + 0.4 * (r2() - 0.5), 1]));

function cli(...argv) { return execFileSync(opt.cli, argv, { encoding: 'utf8' }); }
function csvTable(text) {
  const lines = text.split('\n').filter((l) => l && !l.startsWith('#'));
  const columns = lines[0].split(',');
  const rows = lines.slice(1).map((l) => l.split(',').map((c) => (c === '' ? null : c === 'inf' || c === '-inf' ? c : Number(c))));
  return { columns, rows };
}
// A_θ as the page drew it: each circle of the path starts with an absolute "M x y" at the
// point, then "m-r 0" to its edge (no arc when the point has no mass).
const drawnA = (page, sel = '#cloud-fig path.cloud-a') => page.evaluate((sel) => document.querySelector(sel).getAttribute('d'), sel)
  .then((d) => [...d.matchAll(/M([^ ]+) ([^maM]+)(?:m([^ ]+) 0)?/g)].map((m) => [Number(m[1]), Number(m[2]), m[3] ? -Number(m[3]) : 0]));
function familyPoints(a, b, family, dir, center, thetas) {
  return JSON.parse(execFileSync(opt['family-points'], [a, b, family, dir, center, ...thetas.map(String)], { encoding: 'utf8' }));
}

const sweepArgs = ['--a', aFile, '--b', bFile, '--family', 'shift', '--direction', '1,0.5', '--from', '-1.5', '--to', '1.5',
                   '--steps', '61', '--measures', 'w2,sinkhorn,mmd,energy,hausdorff,js,kl_ab,tv', '--threads', '1',
                   '--refine-budget', '400'];  // enough bisection to confirm the histogram jumps
const t0 = Date.now();
cli('report', ...sweepArgs, '--out', work('main.html'));
cli('sweep', ...sweepArgs, '--out', work('main.csv'));
const sweepCsv = csvTable(fs.readFileSync(work('main.csv'), 'utf8'));
const findingsJson = JSON.parse(cli('findings', '--sweep', work('main.csv'), '--json'));
const measureJson = JSON.parse(cli('measure', '--a', aFile, '--b', bFile, '--measures', 'w2,sinkhorn,mmd,energy,hausdorff,js,kl_ab,tv', '--json'));

// ---- the browser --------------------------------------------------------------------------------
const browser = await launch(opt.chromium, path.join(opt.work, 'profile'));
const problems = [];
async function open(file, viewport = { width: 1360, height: 900 }) {
  const page = await browser.newPage();
  await page.setViewport(viewport);
  const self = pathToFileURL(file).href;
  await page.setRequestInterception(true);
  page.on('request', (req) => {
    if (req.url() === self) return req.continue();
    problems.push(`${path.basename(file)}: request to ${req.url()}`);
    req.abort();
  });
  page.on('console', (m) => { if (m.type() === 'error') problems.push(`${path.basename(file)}: console error: ${m.text()}`); });
  page.on('pageerror', (e) => problems.push(`${path.basename(file)}: uncaught: ${e.message}`));
  page.on('dialog', async (d) => { problems.push(`${path.basename(file)}: a dialog opened: ${d.message()}`); await d.dismiss(); });
  await page.goto(self, { waitUntil: 'load' });
  await page.waitForFunction('window.barrowReport && window.barrowReport.ready', { timeout: 10000 });
  return page;
}

// 1. The data block equals what sweep / findings / measure print.
const page = await open(work('main.html'));
const data = await page.evaluate(() => JSON.parse(document.getElementById('barrow-report-data').textContent));
check(JSON.stringify(Object.keys(data)) === JSON.stringify(['clouds', 'settings', 'measures', 'sweep', 'findings']), 'data block keys');
check(JSON.stringify(data.sweep.columns) === JSON.stringify(sweepCsv.columns), 'sweep columns equal the CSV header');
check(JSON.stringify(data.sweep.rows) === JSON.stringify(sweepCsv.rows), 'sweep rows equal the CSV cells');
check(JSON.stringify(data.findings) === JSON.stringify(findingsJson.findings), 'findings equal findings --json');
const strip = (rows) => rows.map((m) => ({ id: m.id, value: m.value, status: m.status, details: m.details }));
check(JSON.stringify(strip(data.measures)) === JSON.stringify(strip(measureJson.measures)), 'measures equal measure --json (time aside)');

// 2. The slider at the first θ, the middle one and a jump: readouts are the CSV's values, and
// A's points sit where the engine's family map puts them.
const ids = sweepCsv.columns.slice(1, 1 + (sweepCsv.columns.length - 1) / 2);
const jumpFinding = findingsJson.findings.find((f) => f.jumps.length > 0);
check(!!jumpFinding, 'the scenario has a jump (needed for the jump check)');
const rowsN = sweepCsv.rows.length;
const nearestRow = (t) => sweepCsv.rows.reduce((best, r, k) => (Math.abs(r[0] - t) < Math.abs(sweepCsv.rows[best][0] - t) ? k : best), 0);
const targets = [0, Math.floor((rowsN - 1) / 2), jumpFinding ? nearestRow(jumpFinding.jumps[0].theta) : 1];
await page.focus('#theta');
await page.keyboard.press('Home');
check(await page.evaluate(() => window.barrowReport.index()) === 0, 'Home moves the slider to the first θ');
await page.keyboard.press('ArrowRight');
check(await page.evaluate(() => window.barrowReport.index()) === 1, 'the right arrow moves the slider by one θ');
const thetas = targets.map((k) => sweepCsv.rows[k][0]);
const engine = familyPoints(aFile, bFile, 'shift', '1,0.5', '-', thetas);
for (const k of targets) {
  await page.evaluate((k) => { const s = document.getElementById('theta'); s.value = k; s.dispatchEvent(new Event('input', { bubbles: true })); }, k);
  const shown = await page.evaluate(() => Array.from(document.querySelectorAll('#readout tbody tr')).map((tr) => ({
    id: tr.dataset.id, text: tr.querySelector('.value').textContent, exact: tr.querySelector('.value').dataset.exact,
    slope: tr.querySelector('.slope').dataset.exact })));
  const row = sweepCsv.rows[k];
  ids.forEach((id, j) => {
    const s = shown.find((x) => x.id === id), v = row[1 + j], d = row[1 + ids.length + j];
    if (!s) return check(false, `readout row for ${id}`);
    if (v === null) check(s.exact === '', `${id} at row ${k}: failed cell shows no number`);
    else if (v === 'inf') check(s.text === '+∞', `${id} at row ${k}: +∞ shown`);
    else {
      check(Number(s.exact) === v, `${id} at θ=${row[0]}: readout ${s.exact} equals the CSV's ${v}`);
      check(near(Number(s.text), v, 5e-6), `${id} at θ=${row[0]}: shown text ${s.text} rounds the CSV's ${v}`);
      if (d !== null && d !== 'inf') check(Number(s.slope) === d, `${id} at θ=${row[0]}: dD/dθ ${s.slope} equals the CSV's ${d}`);
    }
  });
  const pts = engine[String(row[0])].points;
  const circles = await drawnA(page);
  check(circles.length === pts.length, `A has ${pts.length} points in the figure`);
  for (const i of [0, 7, 19, pts.length - 1])
    check(near(circles[i][0], pts[i][0], 1e-12) && near(circles[i][1], pts[i][1], 1e-12),
          `A point ${i} at θ=${row[0]}: figure (${circles[i]}) vs engine (${pts[i]})`);
}

// 3. The other families move A as the engine does.
for (const [family, dir, center, range] of [['rotate', '-', '0.2,-0.1', ['-120', '150']], ['scale', '-', '-', ['0.5', '2']],
                                            ['interpolate', '-', '-', ['0', '1']], ['mix', '-', '-', ['0', '1']]]) {
  const file = work(`family-${family}.html`);
  const extra = center === '-' ? [] : ['--center', center];
  cli('report', '--a', aFile, '--b', bFile, '--family', family, ...extra, '--from', range[0], '--to', range[1], '--steps', '7',
      '--measures', 'w2,energy', '--threads', '1', '--out', file);
  const p = await open(file);
  const rows = await p.evaluate(() => JSON.parse(document.getElementById('barrow-report-data').textContent).sweep.rows.map((r) => r[0]));
  const picks = [1, rows.length - 2];
  const eng = familyPoints(aFile, bFile, family, '-', center, picks.map((k) => rows[k]));
  for (const k of picks) {
    await p.evaluate((k) => window.barrowReport.setIndex(k), k);
    const got = await drawnA(p);
    const e = eng[String(rows[k])];
    check(got.length === e.points.length, `${family}: ${e.points.length} points in A_θ`);
    for (const i of [0, 3, Math.floor(e.points.length / 2), e.points.length - 1])
      check(near(got[i][0], e.points[i][0], 1e-12) && near(got[i][1], e.points[i][1], 1e-12),
            `${family} point ${i} at θ=${rows[k]}: figure (${got[i]}) vs engine (${e.points[i]})`);
    if (family === 'mix') check(got.slice(0, 40).every((c) => c[2] > 0) && got.slice(40).every((c) => c[2] > 0), 'mix: both point sets carry mass inside (0, 1)');
  }
  await p.close();
}

// 4. Hostile names and title: shown as text, nothing runs, the data block holds them unchanged.
const hostileA = '<script>alert(1)</script>', hostileB = '</script><img src=x onerror=alert(2)>';
const session = {
  format: 'barrow-session', version: 1,
  clouds: { A: { name: hostileA, points: [[0, 0], [1, 0], [0, 1]], weights: [1, 1, 1] },
            B: { name: hostileB, points: [[2, 0], [2, 1]], weights: [1, 2] } },
  measures: { selected: ['w1', 'energy'], params: {} },
  sweep: { family: 'shift', direction: [1, 0], center: null, from: -1, to: 1, steps: 9, reference: null }, view: {},
};
fs.writeFileSync(work('hostile.json'), JSON.stringify(session));
cli('report', '--session', work('hostile.json'), '--title', hostileB, '--threads', '1', '--out', work('hostile.html'));
{
  const p = await open(work('hostile.html'));
  const got = await p.evaluate(() => ({
    imgs: document.querySelectorAll('img').length, scripts: document.querySelectorAll('script').length,
    h1: document.querySelector('h1').textContent, title: document.title,
    names: Array.from(document.querySelectorAll('.files tbody td:nth-child(2)')).map((td) => td.textContent),
    data: JSON.parse(document.getElementById('barrow-report-data').textContent) }));
  check(got.imgs === 0, 'no <img> element came from a name');
  check(got.scripts === 3, 'exactly the page\'s three script elements');
  check(got.h1 === hostileB, 'the hostile title is shown as text');
  check(got.title.startsWith(hostileB), 'the document title is the hostile text');
  check(got.names[0] === hostileA && got.names[1] === hostileB, 'cloud names shown as text');
  check(got.data.clouds.A.name === hostileA && got.data.clouds.B.name === hostileB && got.data.settings.title === hostileB,
        'the data block holds the names unchanged');
  await p.close();
}

// 5. A cloud of one point; 6. a sweep whose measures are all +∞.
writeCloud('one.csv', [[0.25, -0.5, 1]]);
cli('report', '--a', work('one.csv'), '--b', bFile, '--family', 'rotate', '--steps', '9', '--measures', 'w1,w2,energy,hausdorff',
    '--threads', '1', '--out', work('one.html'));
{
  const p = await open(work('one.html'));
  const got = await p.evaluate(() => ({ values: Array.from(document.querySelectorAll('#readout .value')).map((td) => td.textContent) }));
  got.n = (await drawnA(p)).length;
  check(got.n === 1, 'one-point cloud: one marker');
  check(got.values.length === 4 && got.values.every((v) => v !== '—'), 'one-point cloud: every measure has a value');
  await p.close();
}
writeCloud('far.csv', [[100, 100, 1], [101, 100, 1], [100, 101, 1]]);
cli('report', '--a', aFile, '--b', work('far.csv'), '--family', 'shift', '--from', '0', '--to', '0.5', '--steps', '6',
    '--measures', 'kl_ab,kl_ba', '--set', 'density.estimator=hist', '--threads', '1', '--out', work('inf.html'));
{
  const p = await open(work('inf.html'));
  const got = await p.evaluate(() => ({
    rows: JSON.parse(document.getElementById('barrow-report-data').textContent).sweep.rows,
    values: Array.from(document.querySelectorAll('#readout .value')).map((td) => td.textContent),
    marks: Array.from(document.querySelectorAll('#curve-fig path[data-id]')).filter((p) => /v6/.test(p.getAttribute('d') || '')).length }));
  check(got.rows.every((r) => r[1] === 'inf' && r[2] === 'inf'), 'all-infinite sweep: every value is inf in the data');
  check(got.values.length === 2 && got.values.every((v) => v === '+∞'), 'all-infinite sweep: readouts show +∞');
  check(got.marks === 2, 'all-infinite sweep: each curve draws its +∞ marks');
  await p.close();
}

// 7. A screenshot, checked not blank; 8. print to PDF with a bounded page count.
await page.evaluate((k) => window.barrowReport.setIndex(k), targets[2]);
const shot = Buffer.from(await page.screenshot({ type: 'png', fullPage: false }));
fs.writeFileSync(work('main.png'), shot);
const pixels = await (async () => {
  const p = await browser.newPage();
  await p.setRequestInterception(true);
  p.on('request', (req) => (req.url().startsWith('data:') ? req.continue() : (problems.push('pixel page: ' + req.url()), req.abort())));
  const r = await p.evaluate(async (src) => {
    const img = new Image(); img.src = src; await img.decode();
    const c = document.createElement('canvas'); c.width = img.width; c.height = img.height;
    const g = c.getContext('2d'); g.drawImage(img, 0, 0);
    const d = g.getImageData(0, 0, c.width, c.height).data, colours = new Set();
    let ink = 0;
    for (let i = 0; i < d.length; i += 4) { if (d[i] + d[i + 1] + d[i + 2] < 600) ++ink; colours.add((d[i] << 16) | (d[i + 1] << 8) | d[i + 2]); }
    return { ink: ink / (d.length / 4), colours: colours.size, width: c.width };
  }, 'data:image/png;base64,' + shot.toString('base64'));
  await p.close();
  return r;
})();
check(pixels.width === 1360 && pixels.ink > 0.03 && pixels.colours > 50,
      `screenshot is not blank (ink ${pixels.ink.toFixed(3)}, ${pixels.colours} colours)`);
const pdf = Buffer.from(await page.pdf({ format: 'A4', printBackground: true }));
fs.writeFileSync(work('main.pdf'), pdf);
const pages = (pdf.toString('latin1').match(/\/Type\s*\/Page(?![s\w])/g) || []).length;
const PAGE_BOUND = [2, 8];  // 8 measures: header and figures, measures, findings, cautions, commands
check(pages >= PAGE_BOUND[0] && pages <= PAGE_BOUND[1], `PDF has ${pages} pages (bound ${PAGE_BOUND.join('–')})`);
const printed = (await drawnA(page, '.explorer.print-only path.cloud-a'))[0][0];
const atRef = familyPoints(aFile, bFile, 'shift', '1,0.5', '-', [data.sweep.rows[await page.evaluate(() => window.barrowReport.referenceIndex)][0]]);
check(printed === Object.values(atRef)[0].points[0][0], 'the printed figure shows A at the reference θ');

await browser.close();
for (const p of problems) check(false, p);
console.log(`report_browser: ${checks - failures} of ${checks} checks passed in ${((Date.now() - t0) / 1000).toFixed(1)} s`);
process.exit(failures ? 1 : 0);
