// The analysis notes as a reader wants them: the per-part lines "NAME: how it is drawn." that share one
// description are gathered into one line ("uniform over the band: T ambient, Vref, RTOP, …"); other notes stay
// as they are, in order.
export function groupMethodNotes(notes: string[], partNames: Set<string> | null = null): string[] {
  const groups = new Map<string, string[]>();
  const out: Array<string | { key: string }> = [];
  for (const note of notes) {
    const match = /^([^:]{1,40}): (.+?)\.?$/.exec(note);
    const name = match?.[1];
    const isPart = match !== null && name !== undefined && (partNames === null ? !/\s{2,}/.test(name) && !/[.,;]/.test(name) : partNames.has(name));
    if (!match || !isPart || match[2]!.length > 120) {
      out.push(note);
      continue;
    }
    const description = match[2]!;
    const existing = groups.get(description);
    if (existing) existing.push(name!);
    else {
      groups.set(description, [name!]);
      out.push({ key: description });
    }
  }
  return out.map((entry) => (typeof entry === 'string' ? entry : `${entry.key}: ${groups.get(entry.key)!.join(', ')}.`));
}
