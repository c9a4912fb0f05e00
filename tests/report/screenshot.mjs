// Opens a report in the system Chromium and saves a PNG of the first screen (for the README):
//   node tests/report/screenshot.mjs report.html out.png [width height [θ row]]
import path from 'node:path';
import fs from 'node:fs';
import os from 'node:os';
import { pathToFileURL } from 'node:url';
import { launch } from './browser.mjs';

const [file, out, width = '1360', height = '900', row] = process.argv.slice(2);
if (!file || !out) { console.error('usage: screenshot.mjs report.html out.png [width height [row]]'); process.exit(2); }
const profile = fs.mkdtempSync(path.join(os.tmpdir(), 'barrow-shot-'));
const browser = await launch(process.env.BARROW_CHROMIUM || '/usr/bin/chromium', profile);
const page = await browser.newPage();
await page.setViewport({ width: +width, height: +height });
const url = pathToFileURL(path.resolve(file)).href;
await page.setRequestInterception(true);
page.on('request', (r) => (r.url() === url ? r.continue() : r.abort()));
await page.goto(url, { waitUntil: 'load' });
await page.waitForFunction('window.barrowReport && window.barrowReport.ready');
if (row !== undefined) await page.evaluate((k) => window.barrowReport.setIndex(k), +row);
await page.screenshot({ path: out, type: 'png', fullPage: process.env.FULL === '1' });
await browser.close();
fs.rmSync(profile, { recursive: true, force: true });
