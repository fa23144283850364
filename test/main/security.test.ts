import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  APP_ENTRY_URL,
  CONTENT_SECURITY_POLICY,
  isAllowedNavigation,
  isAllowedRequest,
  isTrustedSender,
  permissionDecision,
  secureWebPreferences,
} from '../../main/security';
import { appResponseHeaders, resolveAppPath } from '../../main/appProtocol';
import { MENU_COMMANDS, PayloadError, REQUEST_VALIDATORS } from '../../main/ipc-contract';
import { buildMenuTemplate } from '../../main/menu';
import { DEFAULT_WINDOW_STATE, placeOnDisplays, sanitiseWindowState } from '../../main/windowState';

describe('window hardening', () => {
  it('isolates, sandboxes and keeps Node out of the renderer', () => {
    // Source: Electron security checklist (electronjs.org/docs/latest/tutorial/security), items 2–4, 6, 9, 10
    const prefs = secureWebPreferences('/app/preload.js');
    expect(prefs).toMatchObject({
      contextIsolation: true,
      sandbox: true,
      nodeIntegration: false,
      nodeIntegrationInWorker: false,
      nodeIntegrationInSubFrames: false,
      webSecurity: true,
      allowRunningInsecureContent: false,
      experimentalFeatures: false,
      webviewTag: false,
      preload: '/app/preload.js',
    });
    expect('enableBlinkFeatures' in prefs).toBe(false);
  });

  it('has a strict Content-Security-Policy with no remote sources', () => {
    // Source: Electron security checklist, item 7 (define a Content Security Policy)
    const directives = new Map(
      CONTENT_SECURITY_POLICY.split(';')
        .map((d) => d.trim().split(/\s+/))
        .map(([k, ...v]) => [k, v]),
    );
    expect(directives.get('default-src')).toEqual(["'self'"]);
    expect(directives.get('script-src')).toEqual(["'self'"]);
    expect(directives.get('object-src')).toEqual(["'none'"]);
    expect(CONTENT_SECURITY_POLICY).not.toMatch(/https?:|\*|unsafe-eval/);
  });

  it('ships the same policy in the renderer page', () => {
    const html = readFileSync(new URL('../../renderer/index.html', import.meta.url), 'utf8');
    const meta = /http-equiv="Content-Security-Policy"\s+content="([^"]+)"/.exec(html);
    expect(meta?.[1]).toBe(CONTENT_SECURITY_POLICY);
  });

  it('refuses every network request that is not for the app itself', () => {
    expect(isAllowedRequest(APP_ENTRY_URL)).toBe(true);
    expect(isAllowedRequest('ebbline-app://app/assets/worker.js')).toBe(true);
    expect(isAllowedRequest('blob:ebbline-app://app/1234')).toBe(true);
    for (const url of [
      'https://example.org/',
      'http://127.0.0.1:4173/',
      'ws://localhost/',
      'file:///etc/passwd',
      'ftp://x/',
      'ebbline-app://other/index.html',
      'not a url',
    ]) {
      expect(isAllowedRequest(url), url).toBe(false);
    }
  });

  it('denies navigation away, permissions, and messages from foreign frames', () => {
    expect(isAllowedNavigation('https://example.org/')).toBe(false);
    expect(isAllowedNavigation(APP_ENTRY_URL)).toBe(true);
    expect(permissionDecision('media')).toBe(false);
    expect(permissionDecision('notifications')).toBe(false);
    expect(isTrustedSender(APP_ENTRY_URL, true)).toBe(true);
    expect(isTrustedSender(APP_ENTRY_URL, false)).toBe(false);
    expect(isTrustedSender('https://example.org/', true)).toBe(false);
    expect(isTrustedSender(undefined, true)).toBe(false);
  });
});

describe('app protocol', () => {
  it('serves files inside the renderer folder only', () => {
    expect(resolveAppPath('/srv/renderer', 'ebbline-app://app/')).toBe('/srv/renderer/index.html');
    expect(resolveAppPath('/srv/renderer', 'ebbline-app://app/assets/a.js')).toBe('/srv/renderer/assets/a.js');
    for (const url of [
      'ebbline-app://app/../secret.txt',
      'ebbline-app://app/%2e%2e/secret.txt',
      'ebbline-app://app/assets/%2e%2e%2f%2e%2e%2fsecret',
      'ebbline-app://app/a%5c..%5cb',
      'ebbline-app://app/%00',
      'ebbline-app://elsewhere/index.html',
      'https://app/index.html',
    ]) {
      const resolved = resolveAppPath('/srv/renderer', url);
      expect(resolved === null || resolved.startsWith('/srv/renderer/'), url).toBe(true);
    }
  });

  it('sends the policy and no-sniff with every response', () => {
    expect(appResponseHeaders('/x/index.html')).toMatchObject({
      'Content-Type': 'text/html; charset=utf-8',
      'Content-Security-Policy': CONTENT_SECURITY_POLICY,
      'X-Content-Type-Options': 'nosniff',
    });
    expect(appResponseHeaders('/x/a.js')['Content-Type']).toBe('text/javascript; charset=utf-8');
  });
});

describe('IPC payload validation', () => {
  it('accepts well-formed requests', () => {
    expect(REQUEST_VALIDATORS['statements:open'](null)).toBeNull();
    const req = REQUEST_VALIDATORS['file:save']({
      suggestedName: 'outlook.csv',
      content: 'a,b',
      filter: { name: 'CSV', extensions: ['csv'] },
    });
    expect(req.suggestedName).toBe('outlook.csv');
    const open = { title: 'Restore a workspace backup', filter: { name: 'Ebbline backup', extensions: ['json'] } };
    expect(REQUEST_VALIDATORS['file:open'](open)).toEqual(open);
    // Only the title and the filter reach the dialog: no path can be slipped in.
    expect(REQUEST_VALIDATORS['file:open']({ ...open, defaultPath: '/etc' })).toEqual(open);
  });

  it('refuses malformed or dangerous payloads', () => {
    const bad: [keyof typeof REQUEST_VALIDATORS, unknown][] = [
      ['statements:open', { path: '/etc' }],
      ['file:save', null],
      ['file:save', { suggestedName: '../../.bashrc', content: 'x', filter: { name: 'T', extensions: ['txt'] } }],
      ['file:save', { suggestedName: 'a.csv', content: 42, filter: { name: 'CSV', extensions: ['csv'] } }],
      ['file:save', { suggestedName: 'a.csv', content: 'x', filter: { name: 'CSV', extensions: ['c/sv'] } }],
      ['file:open', null],
      ['file:open', { title: 'Open', filter: { name: 'Backup', extensions: [] } }],
      ['file:open', { title: 'Open', filter: { name: 'Backup', extensions: ['*'] } }],
      ['file:open', { title: 'Line one\nline two', filter: { name: 'Backup', extensions: ['json'] } }],
      ['report:pdf', { suggestedName: 'C:\\x.pdf' }],
      ['app:info', 'hello'],
    ];
    for (const [channel, payload] of bad)
      expect(() => REQUEST_VALIDATORS[channel](payload as never), channel).toThrow(PayloadError);
  });
});

describe('menu', () => {
  it('offers every screen and action with keyboard shortcuts for the main ones', () => {
    const sent: string[] = [];
    const template = buildMenuTemplate((c) => sent.push(c), false);
    const items = template.flatMap((m) => (Array.isArray(m.submenu) ? m.submenu : []));
    for (const item of items) if (typeof item.click === 'function') (item.click as () => void)();
    for (const command of MENU_COMMANDS) expect(sent, command).toContain(command);
    const accelerators = items.map((i) => i.accelerator).filter(Boolean);
    expect(accelerators).toContain('CmdOrCtrl+O');
    expect(new Set(accelerators).size).toBe(accelerators.length); // no shortcut used twice
  });
});

describe('window state', () => {
  it('falls back to defaults for damaged state and clamps sizes', () => {
    expect(sanitiseWindowState('garbage')).toEqual(DEFAULT_WINDOW_STATE);
    expect(sanitiseWindowState({ width: 10, height: 20 })).toEqual({ width: 900, height: 600, maximized: false });
    expect(sanitiseWindowState({ width: 1400, height: 900, x: 10, y: 20, maximized: true })).toEqual({
      width: 1400,
      height: 900,
      x: 10,
      y: 20,
      maximized: true,
    });
  });

  it('forgets a position that lies off every display', () => {
    const displays = [{ x: 0, y: 0, width: 1920, height: 1080 }];
    expect(placeOnDisplays({ width: 1000, height: 700, x: 5000, y: 10, maximized: false }, displays)).toEqual({
      width: 1000,
      height: 700,
      maximized: false,
    });
    expect(placeOnDisplays({ width: 1000, height: 700, x: 100, y: 10, maximized: false }, displays).x).toBe(100);
  });
});
