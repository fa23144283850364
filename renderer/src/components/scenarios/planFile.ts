/**
 * Plan files (.json): the `ebbline.plan/1` document of one scenario, the same file the
 * CLI's `ebbline forecast --plan FILE` reads. Reading refuses what is not a plan document
 * at all; a plan document with problems in its fields is accepted, so the editor can show
 * each problem at its field instead of losing the file.
 */
import { PLAN_SCHEMA } from '../../../../engine/plan/plan';

/** Largest plan file read (a plan holds at most 1,000 items). */
export const MAX_PLAN_FILE_BYTES = 2 * 1024 * 1024;

export type PlanFileReading =
  | { readonly ok: true; readonly document: Record<string, unknown>; readonly name: string | null }
  | { readonly ok: false; readonly message: string };

/**
 * Reads a plan file's bytes (UTF-8, with or without a byte-order mark).
 * @example readPlanFile(new TextEncoder().encode('{"schema":"ebbline.plan/1","items":[]}')).ok // true
 */
export function readPlanFile(bytes: Uint8Array, fileName = 'The file'): PlanFileReading {
  if (bytes.length > MAX_PLAN_FILE_BYTES) {
    return {
      ok: false,
      message: `${fileName} is ${bytes.length.toLocaleString('en')} bytes; a plan file is at most 2 MiB.`,
    };
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes).replace(/^\uFEFF/, '');
  } catch {
    return { ok: false, message: `${fileName} is not UTF-8 text, so it is not a plan file.` };
  }
  let doc: unknown;
  try {
    doc = JSON.parse(text);
  } catch (error) {
    return { ok: false, message: `${fileName} is not valid JSON (${(error as Error).message}).` };
  }
  if (typeof doc !== 'object' || doc === null || Array.isArray(doc)) {
    return {
      ok: false,
      message: `${fileName} holds no JSON object; a plan file starts with {"schema": "${PLAN_SCHEMA}", …}.`,
    };
  }
  const schema = (doc as Record<string, unknown>).schema;
  if (schema !== PLAN_SCHEMA) {
    return {
      ok: false,
      message:
        typeof schema === 'string' && schema.startsWith('ebbline.plan/')
          ? `${fileName} is a plan of a newer kind (${schema}) than this version of Ebbline reads (${PLAN_SCHEMA}).`
          : `${fileName} is not a plan file: its "schema" is ${JSON.stringify(schema ?? null)}, expected "${PLAN_SCHEMA}".`,
    };
  }
  const name = (doc as Record<string, unknown>).name;
  return {
    ok: true,
    document: doc as Record<string, unknown>,
    name: typeof name === 'string' && name.trim() ? name : null,
  };
}

/** The text written to a plan file: the document, indented, ending in a newline. */
export function planFileText(document: unknown): string {
  return `${JSON.stringify(document, null, 2)}\n`;
}

/**
 * A file name for a scenario's plan: its name with characters that file systems refuse
 * replaced.
 * @example planFileName('Kiln: on credit?') // 'Kiln- on credit-.plan.json'
 */
export function planFileName(name: string): string {
  const safe =
    [...name]
      .map((ch) => (ch.charCodeAt(0) < 32 || '\\/:*?"<>|'.includes(ch) ? '-' : ch))
      .join('')
      .replace(/\s+/g, ' ')
      .trim()
      .slice(0, 80) || 'scenario';
  return `${safe}.plan.json`;
}

/** A file name without its folder and last extension, for a scenario named after its file. */
export function nameFromFileName(fileName: string): string {
  return fileName.replace(/^.*[\\/]/, '').replace(/(\.plan)?\.json$/i, '') || 'Imported plan';
}
