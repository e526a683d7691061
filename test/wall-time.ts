// The only figures of a --json report that differ from run to run: wall times (`method.seconds` of the grade search
// and its steps, `studySeconds`, and `varianceBudget.method.seconds`), measured by the CLI and design layer. Tests
// that ask for byte-identical JSON compare the reports with these values blanked; everything else must match.
export function withoutWallTime(json: string): string {
  return json.replace(/"(seconds|studySeconds)":(\s*)(-?[0-9.]+(?:e[+-]?[0-9]+)?|null)/gi, '"$1":$2"(wall time)"');
}
