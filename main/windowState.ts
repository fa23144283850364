/**
 * Remembers the window's size and position between runs in a small JSON file in the
 * user-data folder. A damaged or off-screen state falls back to the defaults.
 */
import fs from 'node:fs';

export interface WindowState {
  width: number;
  height: number;
  x?: number;
  y?: number;
  maximized: boolean;
}

export const DEFAULT_WINDOW_STATE: WindowState = { width: 1280, height: 840, maximized: false };
const MIN_WIDTH = 900;
const MIN_HEIGHT = 600;

/** Validates a parsed state; anything odd becomes the default. */
export function sanitiseWindowState(raw: unknown): WindowState {
  if (typeof raw !== 'object' || raw === null) return { ...DEFAULT_WINDOW_STATE };
  const r = raw as Record<string, unknown>;
  const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? Math.round(v) : undefined);
  const width = num(r.width);
  const height = num(r.height);
  if (width === undefined || height === undefined) return { ...DEFAULT_WINDOW_STATE };
  const state: WindowState = {
    width: Math.min(Math.max(width, MIN_WIDTH), 10_000),
    height: Math.min(Math.max(height, MIN_HEIGHT), 10_000),
    maximized: r.maximized === true,
  };
  const x = num(r.x);
  const y = num(r.y);
  if (x !== undefined && y !== undefined) {
    state.x = x;
    state.y = y;
  }
  return state;
}

/** Keeps a saved position only when the window's top-left lies on one of the displays. */
export function placeOnDisplays(
  state: WindowState,
  displays: readonly { x: number; y: number; width: number; height: number }[],
): WindowState {
  if (state.x === undefined || state.y === undefined) return state;
  const { x, y } = state;
  const visible = displays.some((d) => x >= d.x && y >= d.y && x < d.x + d.width - 100 && y < d.y + d.height - 100);
  if (visible) return state;
  const { x: _x, y: _y, ...rest } = state;
  return rest;
}

export function loadWindowState(file: string): WindowState {
  try {
    return sanitiseWindowState(JSON.parse(fs.readFileSync(file, 'utf8')));
  } catch {
    return { ...DEFAULT_WINDOW_STATE };
  }
}

export function saveWindowState(file: string, state: WindowState): void {
  try {
    fs.writeFileSync(file, JSON.stringify(state));
  } catch {
    // Losing the window size is harmless; never fail closing the app over it.
  }
}
