/**
 * Native open and save dialogs. The renderer never sees a path: it gets file names and
 * bytes, and asks main to save content under a name the user confirms.
 */
import fs from 'node:fs/promises';
import path from 'node:path';
import { dialog, type BrowserWindow } from 'electron';
import type { OpenedFile, OpenRequest, SaveRequest, SaveResult } from './ipc-contract';

/** Same limit as the importers (engine/import/decode.ts MAX_STATEMENT_BYTES). */
const MAX_STATEMENT_BYTES = 256 * 1024 * 1024;

export async function openStatementFiles(window: BrowserWindow): Promise<OpenedFile[]> {
  const result = await dialog.showOpenDialog(window, {
    title: 'Import bank statements',
    properties: ['openFile', 'multiSelections'],
    filters: [
      { name: 'Bank statements', extensions: ['csv', 'txt', 'ofx', 'xml', 'sta', 'mt940', '940', 'tsv'] },
      { name: 'All files', extensions: ['*'] },
    ],
  });
  if (result.canceled) return [];
  const files: OpenedFile[] = [];
  for (const file of result.filePaths) files.push(await readPicked(file));
  return files;
}

async function readPicked(file: string): Promise<OpenedFile> {
  const stat = await fs.stat(file);
  if (stat.size > MAX_STATEMENT_BYTES) {
    throw new Error(`${path.basename(file)}: file is ${stat.size} bytes, the limit is 256 MiB`);
  }
  return { name: path.basename(file), bytes: new Uint8Array(await fs.readFile(file)) };
}

/** One file of the kind asked for (all files can still be shown); null when cancelled. */
export async function openOneFile(window: BrowserWindow, request: OpenRequest): Promise<OpenedFile | null> {
  const result = await dialog.showOpenDialog(window, {
    title: request.title,
    properties: ['openFile'],
    filters: [
      { name: request.filter.name, extensions: [...request.filter.extensions] },
      { name: 'All files', extensions: ['*'] },
    ],
  });
  const [file] = result.filePaths;
  if (result.canceled || file === undefined) return null;
  return readPicked(file);
}

export async function saveContent(window: BrowserWindow, request: SaveRequest): Promise<SaveResult> {
  const result = await dialog.showSaveDialog(window, {
    defaultPath: request.suggestedName,
    filters: [{ name: request.filter.name, extensions: [...request.filter.extensions] }],
  });
  if (result.canceled || !result.filePath) return { saved: false };
  await fs.writeFile(result.filePath, request.content);
  return { saved: true, fileName: path.basename(result.filePath) };
}

export async function saveWindowAsPdf(window: BrowserWindow, suggestedName: string): Promise<SaveResult> {
  const pdf = await window.webContents.printToPDF({
    printBackground: true,
    pageSize: 'A4',
    margins: { marginType: 'default' },
  });
  return saveContent(window, {
    suggestedName,
    content: new Uint8Array(pdf),
    filter: { name: 'PDF', extensions: ['pdf'] },
  });
}
