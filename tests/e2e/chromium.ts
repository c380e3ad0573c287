import { execFileSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';

/** Where Debian's package puts the real binary (the /usr/bin wrapper is a shell script). */
const DEBIAN_CHROMIUM = '/usr/lib/chromium/chromium';

/** The flags every browser test starts Chromium with: headless, and silent on a closed network. */
export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--disable-default-apps',
  '--disable-extensions',
  '--metrics-recording-only',
  '--no-default-browser-check',
];

function isDebian(): boolean {
  try {
    return /^ID=debian$/m.test(readFileSync('/etc/os-release', 'utf8'));
  } catch {
    return false;
  }
}

/** The Chromium binary to drive: `$CHROMIUM_PATH`, else Debian's, else undefined. */
export function findChromium(): string | undefined {
  const fromEnv = process.env.CHROMIUM_PATH;
  if (fromEnv) {
    if (!existsSync(fromEnv)) throw new Error(`CHROMIUM_PATH=${fromEnv} does not exist`);
    return fromEnv;
  }
  return existsSync(DEBIAN_CHROMIUM) ? DEBIAN_CHROMIUM : undefined;
}

/**
 * Finds Chromium, installing Debian's package when running as root on Debian (as on CI and the
 * team's machines). Anywhere else it stops with the exact command to run — never a silent skip.
 */
export function ensureChromium(): string {
  const found = findChromium();
  if (found) return found;
  const command = 'apt-get update && apt-get install -y chromium';
  if (process.getuid?.() === 0 && isDebian()) {
    console.log(`browser tests: Chromium is missing; installing it (${command})`);
    execFileSync('sh', ['-c', command], {
      stdio: 'inherit',
      env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
    });
    const installed = findChromium();
    if (installed) return installed;
  }
  throw new Error(
    `browser tests need Chromium. Install it with:\n  sudo ${command}\n` +
      'or point CHROMIUM_PATH at a Chromium binary.',
  );
}
