// Starts the system Chromium through puppeteer-core (never a downloaded browser) with a fresh
// profile and everything that would reach the network switched off.
import fs from 'node:fs';
import puppeteer from 'puppeteer-core';

export const args = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
                     '--disable-background-networking', '--disable-component-update', '--disable-sync'];

export async function launch(executablePath, profileDir) {
  fs.rmSync(profileDir, { recursive: true, force: true });
  fs.mkdirSync(profileDir, { recursive: true });
  return puppeteer.launch({ executablePath, headless: true, args: [...args, `--user-data-dir=${profileDir}`] });
}
