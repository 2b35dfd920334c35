// Text output fits the terminal: its width when stdout is one, else 80 columns (a pipe, a file,
// a mail). Prose lines wrap at spaces under their own indent; tables are sized by their printers.

export const DEFAULT_WIDTH = 80;

export function outputWidth(stream: { isTTY?: boolean; columns?: number } = process.stdout): number {
  return stream.isTTY && stream.columns && stream.columns >= 40 ? stream.columns : DEFAULT_WIDTH;
}

const TABLE_LINE = /^[┌├│└]/;

/** Words of one line wrapped to `width`, continued under the line's indent plus two spaces. */
export function wrapLine(line: string, width: number): string[] {
  if (line.length <= width || TABLE_LINE.test(line)) return [line];
  const indent = /^\s*/.exec(line)![0];
  const more = `${indent}  `;
  const out: string[] = [];
  const [first, ...rest] = line.slice(indent.length).split(' ');
  let current = indent + first;
  for (const word of rest) {
    if (current.length + 1 + word.length > width && current.trim() !== '') {
      out.push(current);
      current = more + word;
    } else current = `${current} ${word}`;
  }
  out.push(current);
  return out;
}

/** Every line of `text` within `width` columns (a single word longer than that stays whole). */
export function fitText(text: string, width: number = outputWidth()): string {
  return text
    .split('\n')
    .flatMap((l) => wrapLine(l, width))
    .join('\n');
}

/**
 * Help notes are written as paragraphs broken for reading in the source; rejoin a paragraph's
 * lines (unindented, one after another, the first not a heading ending in ":") before wrapping.
 */
export function reflowParagraphs(text: string): string {
  const out: string[] = [];
  for (const line of text.split('\n')) {
    const prev = out[out.length - 1];
    if (prev && line && !/^\s/.test(line) && !/^\s/.test(prev) && !prev.endsWith(':')) out[out.length - 1] = `${prev} ${line}`;
    else out.push(line);
  }
  return out.join('\n');
}
