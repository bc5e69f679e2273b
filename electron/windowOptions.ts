/**
 * Security settings of the Electron shell as pure data and pure functions, so that tests can
 * assert them without Electron running. `main.ts` is the only user.
 */
import type { WebPreferences } from 'electron';

/**
 * Web preferences for every window: context isolation and the sandbox on, no Node in the
 * renderer, web security on. `preloadPath` must be an absolute path to the bundled preload.
 */
export function secureWebPreferences(preloadPath: string): WebPreferences {
  return {
    preload: preloadPath,
    contextIsolation: true,
    sandbox: true,
    nodeIntegration: false,
    nodeIntegrationInWorker: false,
    nodeIntegrationInSubFrames: false,
    webSecurity: true,
    allowRunningInsecureContent: false,
    experimentalFeatures: false,
    webviewTag: false,
    navigateOnDragDrop: false,
    spellcheck: false,
  };
}

const CSP_DIRECTIVES: readonly string[] = [
  "default-src 'self'",
  "script-src 'self'",
  // Inline style attributes: echarts writes tooltip HTML with style="...". Scripts stay strict.
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self' data:",
  "connect-src 'self'",
  "worker-src 'self' blob:",
  "object-src 'none'",
  "base-uri 'none'",
  "form-action 'none'",
];

/**
 * The policy of the `<meta http-equiv="Content-Security-Policy">` tag in renderer/index.html.
 * It lacks `frame-ancestors`, which browsers ignore (with a warning) inside a meta tag.
 */
export const CONTENT_SECURITY_POLICY_META: string = CSP_DIRECTIVES.join('; ');

/** The policy main sends as a response header on every load. */
export const CONTENT_SECURITY_POLICY: string = [...CSP_DIRECTIVES, "frame-ancestors 'none'"].join('; ');

/** Parses a URL, or returns null instead of throwing. */
function parseUrl(url: string): URL | null {
  try {
    return new URL(url);
  } catch {
    return null;
  }
}

/**
 * Whether a window may navigate to `target`: only to the app's own page `appUrl` (same
 * file for file: URLs, same origin for http(s) URLs), hash and query changes allowed.
 */
export function isAllowedNavigation(target: string, appUrl: string): boolean {
  const to = parseUrl(target);
  const app = parseUrl(appUrl);
  if (to === null || app === null) return false;
  if (to.protocol !== app.protocol) return false;
  if (app.protocol === 'file:') return to.host === app.host && to.pathname === app.pathname;
  if (app.protocol === 'http:' || app.protocol === 'https:') return to.origin === app.origin;
  return false;
}

/** Whether a URL may be handed to the system browser: http(s) only, no embedded credentials. */
export function isExternalHttpUrl(url: string): boolean {
  const parsed = parseUrl(url);
  if (parsed === null) return false;
  if (parsed.protocol !== 'http:' && parsed.protocol !== 'https:') return false;
  return parsed.username === '' && parsed.password === '';
}
