/**
 * Hides whether the renderer runs in the desktop window or in a browser tab. In the desktop
 * window `window.ebbline` (the preload API) opens native dialogs; in a browser the same
 * calls use a file input and a download link.
 */
import type { EbblineApi, MenuCommand } from '../../../../main/ipc-contract';

export interface PickedFile {
  readonly name: string;
  readonly bytes: Uint8Array;
}

export interface HostBridge {
  readonly kind: 'desktop' | 'browser';
  /** Lets the user pick statement files; resolves to [] when cancelled. */
  pickStatementFiles(): Promise<PickedFile[]>;
  /** Lets the user pick one file of a kind (a backup, a plan); resolves to null when cancelled. */
  pickFile(kind: FileKind): Promise<PickedFile | null>;
  /** Saves content under a name the user confirms; resolves to false when cancelled. */
  saveFile(
    suggestedName: string,
    content: string | Uint8Array,
    filter: { name: string; extensions: string[] },
  ): Promise<boolean>;
  /** Saves the current page as PDF (desktop) or opens the print dialog (browser). */
  printReport(suggestedName: string): Promise<boolean>;
  /** Menu commands (desktop only; a no-op subscription in the browser). */
  onMenuCommand(listener: (command: MenuCommand) => void): () => void;
}

declare global {
  interface Window {
    ebbline?: EbblineApi;
  }
}

/** What the open dialog asks for: its title and the kind of file, by extension. */
export interface FileKind {
  readonly title: string;
  readonly name: string;
  readonly extensions: readonly string[];
}

function readAsBytes(file: File): Promise<PickedFile> {
  return file.arrayBuffer().then((buffer) => ({ name: file.name, bytes: new Uint8Array(buffer) }));
}

/** Opens the browser's file chooser. */
function chooseFiles(accept: string, multiple: boolean): Promise<File[]> {
  return new Promise((resolve) => {
    const input = document.createElement('input');
    input.type = 'file';
    input.accept = accept;
    input.multiple = multiple;
    input.style.display = 'none';
    input.addEventListener('change', () => {
      resolve(Array.from(input.files ?? []));
      input.remove();
    });
    input.addEventListener('cancel', () => {
      resolve([]);
      input.remove();
    });
    document.body.append(input);
    input.click();
  });
}

function browserBridge(): HostBridge {
  return {
    kind: 'browser',
    async pickStatementFiles() {
      const files = await chooseFiles('.csv,.txt,.ofx,.xml,.sta,.940,.mt940,.tsv,text/*,application/xml', true);
      return Promise.all(files.map(readAsBytes));
    },
    async pickFile(kind) {
      const [file] = await chooseFiles(kind.extensions.map((e) => `.${e}`).join(','), false);
      return file ? readAsBytes(file) : null;
    },
    async saveFile(suggestedName, content, filter) {
      const type = filter.extensions.includes('csv')
        ? 'text/csv'
        : filter.extensions.includes('json')
          ? 'application/json'
          : 'application/octet-stream';
      const blob = new Blob([typeof content === 'string' ? content : new Uint8Array(content)], { type });
      const url = URL.createObjectURL(blob);
      const a = document.createElement('a');
      a.href = url;
      a.download = suggestedName;
      document.body.append(a);
      a.click();
      a.remove();
      setTimeout(() => URL.revokeObjectURL(url), 10_000);
      return true;
    },
    async printReport() {
      window.print();
      return true;
    },
    onMenuCommand() {
      return () => {};
    },
  };
}

function desktopBridge(api: EbblineApi): HostBridge {
  return {
    kind: 'desktop',
    pickStatementFiles: () => api.openStatements(),
    pickFile: (kind) => api.openFile({ title: kind.title, filter: { name: kind.name, extensions: kind.extensions } }),
    async saveFile(suggestedName, content, filter) {
      const result = await api.saveFile({ suggestedName, content, filter });
      return result.saved;
    },
    async printReport(suggestedName) {
      const result = await api.saveReportPdf({ suggestedName });
      return result.saved;
    },
    onMenuCommand: (listener) => api.onMenuCommand(listener),
  };
}

let bridge: HostBridge | undefined;

/** The host bridge of this window. */
export function hostBridge(): HostBridge {
  bridge ??= window.ebbline ? desktopBridge(window.ebbline) : browserBridge();
  return bridge;
}
