// Plain text broken into lines at spaces (for help texts and notes in a terminal).

/** Breaks text into lines of at most `width` characters at spaces (a longer word stands alone on its line). */
export function wrapText(text: string, width: number): string {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(' ')) {
    if (line !== '' && line.length + 1 + word.length > width) {
      lines.push(line);
      line = word;
    } else line = line === '' ? word : `${line} ${word}`;
  }
  if (line !== '') lines.push(line);
  return lines.join('\n');
}
