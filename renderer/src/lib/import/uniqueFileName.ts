/**
 * The ledger tells files apart by name, so two different files both called `export.csv`
 * get distinct names in a workspace: `export.csv`, `export (2).csv`, …
 */

/**
 * A name not in `taken`, derived from `name`. Does not add it to `taken`.
 * @example uniqueFileName('export.csv', new Set(['export.csv'])) // 'export (2).csv'
 * @example uniqueFileName('README', new Set(['README'])) // 'README (2)'
 */
export function uniqueFileName(name: string, taken: ReadonlySet<string>): string {
  const base = name.split(/[\\/]/).pop() || name;
  if (!taken.has(base)) return base;
  const dot = base.lastIndexOf('.');
  const stem = dot > 0 ? base.slice(0, dot) : base;
  const ext = dot > 0 ? base.slice(dot) : '';
  for (let n = 2; ; n++) {
    const candidate = `${stem} (${n})${ext}`;
    if (!taken.has(candidate)) return candidate;
  }
}
