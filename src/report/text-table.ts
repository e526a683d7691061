// Plain cli-table3 tables without colour codes (output may go to a file or a CI log).
import Table from 'cli-table3';

export function textTable(head: string[], rows: string[][], alignRight: boolean[] = []): string {
  const table = new Table({
    head,
    style: { head: [], border: [], compact: false },
    // No rule between body rows: compact enough for a terminal, still readable in a log.
    chars: { mid: '', 'left-mid': '', 'mid-mid': '', 'right-mid': '' },
    colAligns: head.map((_, i) => (alignRight[i] ? 'right' : 'left')),
  });
  for (const row of rows) table.push(row);
  return table.toString();
}
