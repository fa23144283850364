/**
 * Plain-text tables for the command line: columns padded to their widest cell, numbers
 * right-aligned, two spaces between columns, no trailing spaces.
 */

/** Column alignment. */
export type Align = 'left' | 'right';

/**
 * Lays out a header row and body rows.
 * @example textTable(['a', 'n'], [['x', '10']], ['left', 'right']) // 'a   n\nx  10'
 */
export function textTable(
  header: readonly string[],
  rows: readonly (readonly string[])[],
  align: readonly Align[],
): string {
  const all = [header, ...rows];
  const widths = header.map((_, c) => Math.max(...all.map((r) => [...(r[c] ?? '')].length)));
  return all
    .map((r) =>
      r
        .map((cell, c) => {
          const pad = ' '.repeat((widths[c] as number) - [...cell].length);
          return align[c] === 'right' ? pad + cell : cell + pad;
        })
        .join('  ')
        .trimEnd(),
    )
    .join('\n');
}
