/**
 * Hardening of the desktop shell as plain functions and constants, so tests can check
 * them without an Electron binary. Follows the Electron security checklist
 * (electronjs.org/docs/latest/tutorial/security): context isolation, process sandbox, no
 * Node integration, web security on, a strict Content-Security-Policy, navigation and new
 * windows denied, permissions denied, and, because Ebbline is offline by design, every
 * request that is not for the app's own files refused.
 */

/** The privileged scheme the renderer is served from (never `file://`). */
export const APP_SCHEME = 'ebbline-app';
export const APP_HOST = 'app';
export const APP_ORIGIN = `${APP_SCHEME}://${APP_HOST}`;
export const APP_ENTRY_URL = `${APP_ORIGIN}/index.html`;

/** The Content-Security-Policy of every app response; renderer/index.html carries the same policy. */
export const CONTENT_SECURITY_POLICY = [
  "default-src 'self'",
  "script-src 'self'",
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self'",
  "connect-src 'self'",
  "worker-src 'self' blob:",
  "object-src 'none'",
  "base-uri 'none'",
  "form-action 'none'",
  "frame-ancestors 'none'",
].join('; ');

/** The web preferences of the one window. */
export function secureWebPreferences(preloadPath: string) {
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
    safeDialogs: true,
    spellcheck: false,
  } as const;
}

function parse(url: string): URL | undefined {
  try {
    return new URL(url);
  } catch {
    return undefined;
  }
}

/** True for URLs of the app's own files. */
export function isAppUrl(url: string): boolean {
  const u = parse(url);
  return u !== undefined && u.protocol === `${APP_SCHEME}:` && u.host === APP_HOST;
}

/**
 * Whether a network request may proceed: only the app's own files, in-memory `blob:` and
 * `data:` URLs (charts, worker), and the developer tools. Everything else — http(s), ws,
 * file, ftp — is refused.
 */
export function isAllowedRequest(url: string): boolean {
  if (isAppUrl(url)) return true;
  const u = parse(url);
  if (!u) return false;
  return u.protocol === 'blob:' || u.protocol === 'data:' || u.protocol === 'devtools:';
}

/** Navigation away from the app is never allowed; reloading the app itself is. */
export function isAllowedNavigation(url: string): boolean {
  return isAppUrl(url);
}

/** Every permission request (camera, notifications, geolocation …) is denied. */
export function permissionDecision(_permission: string): false {
  return false;
}

/** An IPC message is accepted only from the app's own top frame. */
export function isTrustedSender(frameUrl: string | undefined, isMainFrame: boolean): boolean {
  return isMainFrame && frameUrl !== undefined && isAppUrl(frameUrl);
}
