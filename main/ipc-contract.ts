/**
 * The one IPC contract between the Electron main process and the renderer. Each channel
 * maps to its request and response types; the preload derives `window.ebbline` from
 * `API_METHODS`, and main validates every payload with `REQUEST_VALIDATORS` before acting.
 * Nothing else crosses the process boundary.
 */

/** A statement file the user picked in the native open dialog. */
export interface OpenedFile {
  readonly name: string;
  readonly bytes: Uint8Array;
}

/** One file of a kind the renderer names (a backup, a plan file), picked in the open dialog. */
export interface OpenRequest {
  /** The dialog's title, e.g. "Restore a workspace backup". */
  readonly title: string;
  /** Dialog filter, e.g. { name: 'Ebbline backup', extensions: ['json'] }. */
  readonly filter: { readonly name: string; readonly extensions: readonly string[] };
}

export interface SaveRequest {
  readonly suggestedName: string;
  /** Text (CSV, JSON, HTML) or bytes (zipped backup, PDF). */
  readonly content: string | Uint8Array;
  /** Dialog filter, e.g. { name: 'CSV', extensions: ['csv'] }. */
  readonly filter: { readonly name: string; readonly extensions: readonly string[] };
}

export interface SaveResult {
  readonly saved: boolean;
  /** The file name (not the full path) written, for the confirmation message. */
  readonly fileName?: string;
}

export interface AppInfo {
  readonly version: string;
  readonly platform: string;
  readonly electron: string;
}

export interface PdfRequest {
  readonly suggestedName: string;
}

/** Channels the renderer invokes and main answers. */
export interface IpcContract {
  'statements:open': { request: null; response: OpenedFile[] };
  'file:open': { request: OpenRequest; response: OpenedFile | null };
  'file:save': { request: SaveRequest; response: SaveResult };
  'report:pdf': { request: PdfRequest; response: SaveResult };
  'app:info': { request: null; response: AppInfo };
}

export type IpcChannel = keyof IpcContract;

/** Commands the application menu sends to the renderer on channel `menu:command`. */
export const MENU_COMMANDS = [
  'import-statements',
  'new-workspace',
  'show-accounts',
  'show-transactions',
  'show-recurring',
  'show-forecast',
  'show-patterns',
  'show-scenarios',
  'show-report',
  'export-backup',
  'restore-backup',
  'print-report',
] as const;
export type MenuCommand = (typeof MENU_COMMANDS)[number];
export const MENU_CHANNEL = 'menu:command';

/** Method names of `window.ebbline` and the channel each one invokes. */
export const API_METHODS = {
  openStatements: 'statements:open',
  openFile: 'file:open',
  saveFile: 'file:save',
  saveReportPdf: 'report:pdf',
  appInfo: 'app:info',
} as const satisfies Record<string, IpcChannel>;

type Invoker<C extends IpcChannel> = IpcContract[C]['request'] extends null
  ? () => Promise<IpcContract[C]['response']>
  : (request: IpcContract[C]['request']) => Promise<IpcContract[C]['response']>;

/** The API the preload exposes as `window.ebbline`, derived from the contract. */
export type EbblineApi = { readonly [M in keyof typeof API_METHODS]: Invoker<(typeof API_METHODS)[M]> } & {
  /** Subscribes to menu commands; returns the unsubscribe function. */
  readonly onMenuCommand: (listener: (command: MenuCommand) => void) => () => void;
};

/** Thrown (and reported to the renderer as a rejected promise) for a malformed payload. */
export class PayloadError extends Error {
  constructor(channel: string, problem: string) {
    super(`${channel}: ${problem}`);
    this.name = 'PayloadError';
  }
}

function isRecord(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}

// Printable characters only, no folder separators or characters Windows forbids in names.
const SAFE_FILE_NAME = /^[^/\\:*?"<>|]{1,200}$/;
const hasControlCharacter = (s: string) => [...s].some((ch) => ch.charCodeAt(0) < 0x20);
const MAX_SAVE_BYTES = 512 * 1024 * 1024;

function fileName(channel: string, x: unknown): string {
  if (typeof x !== 'string' || !SAFE_FILE_NAME.test(x) || hasControlCharacter(x) || x === '.' || x === '..') {
    throw new PayloadError(channel, 'suggestedName must be a plain file name without folders');
  }
  return x;
}

function dialogFilter(channel: string, filter: unknown): OpenRequest['filter'] {
  if (
    !isRecord(filter) ||
    typeof filter.name !== 'string' ||
    filter.name.length > 100 ||
    hasControlCharacter(filter.name) ||
    !Array.isArray(filter.extensions) ||
    filter.extensions.length === 0 ||
    !filter.extensions.every((e) => typeof e === 'string' && /^[a-z0-9]{1,8}$/i.test(e))
  ) {
    throw new PayloadError(channel, 'filter must be { name, extensions: ["csv", …] }');
  }
  return { name: filter.name, extensions: filter.extensions as string[] };
}

/** Validators per channel: each returns the typed request or throws PayloadError. */
export const REQUEST_VALIDATORS: { readonly [C in IpcChannel]: (payload: unknown) => IpcContract[C]['request'] } = {
  'statements:open': (p) => {
    if (p !== null && p !== undefined) throw new PayloadError('statements:open', 'takes no payload');
    return null;
  },
  'app:info': (p) => {
    if (p !== null && p !== undefined) throw new PayloadError('app:info', 'takes no payload');
    return null;
  },
  'file:open': (p) => {
    const c = 'file:open';
    if (!isRecord(p)) throw new PayloadError(c, 'expected an object');
    if (typeof p.title !== 'string' || p.title.length > 200 || hasControlCharacter(p.title)) {
      throw new PayloadError(c, 'title must be a line of text');
    }
    return { title: p.title, filter: dialogFilter(c, p.filter) };
  },
  'file:save': (p) => {
    const c = 'file:save';
    if (!isRecord(p)) throw new PayloadError(c, 'expected an object');
    const suggestedName = fileName(c, p.suggestedName);
    const content = p.content;
    if (typeof content !== 'string' && !(content instanceof Uint8Array)) {
      throw new PayloadError(c, 'content must be text or bytes');
    }
    const size = typeof content === 'string' ? content.length * 3 : content.byteLength;
    if (size > MAX_SAVE_BYTES) throw new PayloadError(c, 'content is larger than 512 MiB');
    return { suggestedName, content, filter: dialogFilter(c, p.filter) };
  },
  'report:pdf': (p) => {
    const c = 'report:pdf';
    if (!isRecord(p)) throw new PayloadError(c, 'expected an object');
    return { suggestedName: fileName(c, p.suggestedName) };
  },
};
