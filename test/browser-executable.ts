// Which Chromium the browser test drives, without ever downloading one:
//   1. Debian's package at /usr/bin/chromium when it is installed;
//   2. otherwise the build that the dev dependency @sparticuz/chromium ships inside its npm tarball (brotli files in
//      its bin/ folder), unpacked once into node_modules/.cache/trimfree-chromium-<version>/ and reused after that.
// The package unpacks into os.tmpdir() (/tmp/chromium, shared by every user and every run on the machine, and
// returned as soon as the file exists even while another process is still writing it). So we point TMPDIR at a
// private staging folder while it unpacks, then rename the whole folder into the cache in one step: a second test
// run at the same time either sees the finished folder or unpacks its own copy, never a half-written binary.
// Launch flags: `--no-sandbox --disable-gpu` only. The package's own argument list (`chromium.args`, which carries
// `--single-process`) crashed the page under playwright-core 1.65.1 on Node 20.
import { existsSync, mkdirSync, mkdtempSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { PROJECT_ROOT } from '../src/project-root.js';

export const SYSTEM_CHROMIUM = '/usr/bin/chromium';

/** The flags every launch uses, whichever binary runs. */
export const BROWSER_ARGS = ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'];

export interface BrowserExecutable {
  path: string;
  /** 'system' (Debian's package) or 'npm' (the build shipped in @sparticuz/chromium). */
  source: 'system' | 'npm';
  /** Environment for the browser process (the npm build gets a fontconfig file naming its own fonts too). */
  env: Record<string, string>;
}

function packageVersion(): string {
  const manifest = JSON.parse(readFileSync(join(PROJECT_ROOT, 'node_modules', '@sparticuz', 'chromium', 'package.json'), 'utf8')) as { version: string };
  return manifest.version;
}

/** A fontconfig file that reads the system's configuration when there is one, plus the fonts the package ships,
 * so text renders on a machine with no fonts installed. */
function fontsConf(folder: string): string {
  return `<?xml version="1.0"?>
<!DOCTYPE fontconfig SYSTEM "fonts.dtd">
<fontconfig>
  <include ignore_missing="yes">/etc/fonts/fonts.conf</include>
  <dir>${join(folder, 'fonts', 'fonts')}</dir>
  <cachedir>${join(folder, 'fonts-cache')}</cachedir>
</fontconfig>
`;
}

/** Unpacks the npm-shipped Chromium into the cache (once) and returns the folder holding `chromium`. */
async function unpackedNpmChromium(): Promise<string> {
  const cacheRoot = join(PROJECT_ROOT, 'node_modules', '.cache');
  const folder = join(cacheRoot, `trimfree-chromium-${packageVersion()}`);
  if (existsSync(join(folder, 'chromium'))) return folder;
  mkdirSync(cacheRoot, { recursive: true });
  const staging = mkdtempSync(join(cacheRoot, 'trimfree-chromium-staging-'));
  const savedTmpdir = process.env.TMPDIR;
  try {
    process.env.TMPDIR = staging;
    const { default: chromium } = await import('@sparticuz/chromium');
    const binary = await chromium.executablePath();
    if (binary !== join(staging, 'chromium')) throw new Error(`@sparticuz/chromium unpacked to ${binary}, expected ${join(staging, 'chromium')}`);
  } finally {
    if (savedTmpdir === undefined) delete process.env.TMPDIR;
    else process.env.TMPDIR = savedTmpdir;
  }
  writeFileSync(join(staging, 'fonts.conf'), fontsConf(folder));
  try {
    renameSync(staging, folder);
  } catch (error) {
    // Another run finished first: keep its folder, drop ours.
    rmSync(staging, { recursive: true, force: true });
    if (!existsSync(join(folder, 'chromium'))) throw error;
  }
  return folder;
}

/** The Chromium to drive: the system's when installed, else the npm-shipped build (unpacked on first use). */
export async function findChromium(): Promise<BrowserExecutable> {
  if (existsSync(SYSTEM_CHROMIUM)) return { path: SYSTEM_CHROMIUM, source: 'system', env: {} };
  const folder = await unpackedNpmChromium();
  return { path: join(folder, 'chromium'), source: 'npm', env: { FONTCONFIG_FILE: join(folder, 'fonts.conf') } };
}
