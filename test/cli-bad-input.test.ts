// Hand-written bad COMMAND-LINE input (design-file mistakes are in design-load.test.ts; the six impossible designs
// below show the line a user sees): each row is one subprocess of
// the built CLI (npm test builds dist/ first), with the exact exit code, the option or argument the one line must
// name, and the words that say what is accepted or what to change. Expected wording: the error policy in
// src/errors.ts and src/cli/run.ts (one line "trimfree: WHERE: PROBLEM; accepted: …" or "…; to fix: …", exit 2).
// Rows marked `alone` run as their own subprocess through the real entry point (dist/src/cli/main.js); the rest run
// in ONE batch subprocess that calls the same runCli on each row in turn (node's start-up, not the rows, was most
// of the table's time), so the whole table costs a few seconds on two cores.
import { spawn, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { PROJECT_ROOT } from '../src/project-root.js';

const MAIN = join(PROJECT_ROOT, 'dist', 'src', 'cli', 'main.js');
const CHARGER = 'examples/charger-2s-liion.json';
const LED = 'examples/led-driver-highside.json';

/** A stock list of `n` distinct values spread evenly in log over 10 Ω..10 MΩ (so 5/6 of them lie in 1 Ω..1 MΩ). */
function stockFile(name: string, n: number): string {
  const lines: string[] = [];
  for (let i = 0; i < n; i++) lines.push((10 * 10 ** ((6 * i) / n)).toPrecision(7));
  const path = join(dir, `${name}.txt`);
  writeFileSync(path, `${lines.join('\n')}\n`);
  return path;
}

/** A file of `text` in the temporary folder. */
function fileWith(name: string, text: string | Buffer): string {
  const path = join(dir, name);
  writeFileSync(path, text);
  return path;
}

/** A FIFO in the temporary folder (mkfifo needs no privilege). */
function fifo(name: string): string {
  const path = join(dir, name);
  spawnSync('mkfifo', [path]);
  return path;
}

/** The charger example with one change, written to a temporary file (for the impossible requests a design states). */
const dir = mkdtempSync(join(tmpdir(), 'trimfree-bad-'));
function chargerWith(name: string, change: (d: Record<string, any>) => void): string {
  const design = JSON.parse(readFileSync(join(PROJECT_ROOT, CHARGER), 'utf8')) as Record<string, any>;
  change(design);
  const path = join(dir, `${name}.json`);
  writeFileSync(path, JSON.stringify(design));
  return path;
}

interface Row {
  args: string[];
  code: number;
  /** The one stderr line must start with "trimfree: " + this (the option, argument or field it names). */
  where: string;
  /** …and match this (what was given, what is accepted, or what to change). */
  says: RegExp;
  /** Run as its own subprocess through main.ts (a sample of every kind of ending), not in the batch. */
  alone?: boolean;
}

const T = ['--trials', '2000'];

const ROWS: Row[] = [
  // values
  { alone: true, args: ['values', 'E25'], code: 2, where: 'series:', says: /unknown series 'E25'; accepted: E3, E6, E12, E24, E48, E96, E192/ },
  { args: ['values', 'E24', '--from', '10k', '--to', '1k'], code: 2, where: '--from/--to:', says: /inverted.*accepted: --from ≤ --to/ },
  { args: ['values', 'E24', '--from', '4x7'], code: 2, where: '--from:', says: /unexpected character 'x' at position 2 in '4x7'; accepted: .*4K7/ },
  { args: ['values', 'E192', '--from', '1', '--to', '10M'], code: 2, where: '--from/--to:', says: /the range holds 1345 E192 values, more than the 1200 a table lists; accepted: a narrower range \(E192: at most 6 decades\), or --json/ },
  { args: ['values', 'E24', '--to', '0'], code: 2, where: '--to:', says: /greater than zero, got '0'/ },
  { alone: true, args: ['values', 'E24', '--bogus'], code: 2, where: "unknown option '--bogus'", says: /see 'trimfree values --help'/ },
  { alone: true, args: ['values'], code: 2, where: "missing required argument 'series'", says: /see 'trimfree values --help'/ },
  // nearest
  { args: ['nearest', '0'], code: 2, where: 'value:', says: /greater than zero, got '0'; accepted: a positive number/ },
  { args: ['nearest', '4k7', '--series', 'E7'], code: 2, where: '--series:', says: /unknown series 'E7'; accepted: E3/ },
  { args: ['nearest', '4k7', '--count', '0'], code: 2, where: '--count:', says: /0 is out of range; accepted: a whole number from 1 to 50/ },
  { args: ['nearest', 'NaN'], code: 2, where: 'value:', says: /unexpected character 'N' at position 1 in 'NaN'/ },
  { args: ['nearest', '1e999'], code: 2, where: 'value:', says: /'1e999' is out of range/ },
  // divider
  { alone: true, args: ['divider', '--vref', '1.25', '--vout', '1.0'], code: 2, where: '--vout:', says: /at or below the reference.*; to fix: ask for an output above Vref/ },
  { args: ['divider', '--vref', '0', '--vout', '5'], code: 2, where: '--vref:', says: /must be positive, got 0 V; accepted: a positive voltage/ },
  { args: ['divider', '--vout', '5'], code: 2, where: "required option '--vref <volts>' not specified", says: /see 'trimfree divider --help'/ },
  { args: ['divider', '--vref', '1.25', '--vout', '12', '--series', 'E96,E13'], code: 2, where: '--series:', says: /unknown series 'E13'/ },
  { args: ['divider', '--vref', '1.25', '--vout', '12', '--bottom', '10k..1k'], code: 2, where: '--bottom:', says: /'10k\.\.1k' is inverted.*accepted: LO\.\.HI with LO ≤ HI/ },
  { args: ['divider', '--vref', '1.25', '--vout', '12', '--parts', '4'], code: 2, where: '--parts:', says: /4 is out of range; accepted: a whole number from 2 to 3/ },
  { args: ['divider', '--vref', '1.25', '--vout', '12', '--tolerance', '150%'], code: 2, where: '--tolerance:', says: /'150%' is out of range; accepted: 0 % to 50 %/ },
  { args: ['divider', '--vref', '1.25', '--vout', '12', '--stock', '/nonexistent/stock.txt'], code: 2, where: '--stock:', says: /cannot read '\/nonexistent\/stock\.txt' \(no such file\); accepted: a readable text file/ },
  { args: ['divider', '--vref', '1.25', '--vout', '3.3..24'], code: 2, where: '--vout:', says: /needs a pot; accepted: a single voltage, or a range with --pot/ },
  { args: ['divider', '--vref', '1.25', '--vout', '12', '--pot', '10k', '--pot-leg', 'middle'], code: 2, where: "option '--pot-leg <leg>' argument 'middle' is invalid", says: /Allowed choices are top, bottom/ },
  { args: ['divider', '--vref', '1.25', '--vout', '12', '--ifb', '1A'], code: 2, where: '--bottom:', says: /100×\|Ifb\|.*; to fix: widen --bottom or --current, .*smaller bias current \(--ifb\) or lower --bias-ratio$/ },
  // a negative divider-current window was silently ignored (exit 0 with 91 µA and 912 µA candidates)
  { args: ['divider', '--vref', '1.25', '--vout', '12', '--current', '-1mA..-10uA'], code: 2, where: '--current:', says: /window -1\.00 mA\.\.-10\.0 µA is not above zero; accepted: LO\.\.HI with 0 < LO ≤ HI/ },
  { args: ['divider', '--vref', '1.25', '--vout', '12', '--current', '0A..1mA'], code: 2, where: '--current:', says: /is not above zero/ },
  // a three-part search over a huge list took minutes and ignored Ctrl-C: refused with the size it takes
  { args: ['divider', '--vref', '1.25', '--vout', '12', '--parts', '3', '--stock', stockFile('stock-3000', 3000)], code: 2, where: '--stock:', says: /25\d\d distinct values between 1\.00 Ω and 1\.00 MΩ are more than the 2000 a three-part search takes.*; accepted: at most 2000 values in range with --parts 3/ },
  { args: ['divider', '--vref', '1.25', '--vout', '12', '--ifb', '20n..10n'], code: 2, where: '--ifb:', says: /'20n\.\.10n' is inverted.*; accepted: a current as a typical value \(20n: exactly 20 nA\), a ± band .*max 20n/ },
  { args: ['divider', '--vref', '1.25', '--vout', '12', '--ifb', 'max -5n'], code: 2, where: '--ifb:', says: /a maximum must not be negative.*; accepted: .*for a current out of the pin give a range/ },
  { args: ['sense', '--limit', '3A', '--threshold', '1V', '--ratio-tol', '0.05%'], code: 2, where: '--ratio-tol:', says: /a gain network is offered for the diff topology's R1–R4, not noninv; accepted: --topology diff with --ratio-tol/ },
  { args: ['sense', '--limit', '3A', '--topology', 'diff', '--threshold', '1V', '--tolerance', '0.1%', '--ratio-tol', '0.2%'], code: 2, where: '--ratio-tol:', says: /0\.20 % is wider than the 0\.10 % absolute --tolerance; accepted: a ratio tolerance at most --tolerance/ },
  { args: ['sense', '--limit', '3A', '--topology', 'diff', '--threshold', '1V', '--ratio-tol', '0.05x'], code: 2, where: '--ratio-tol:', says: /unexpected character 'x' at position 5 in '0\.05x'; accepted: a percentage/ },
  { args: ['sense', '--limit', '3A', '--topology', 'diff', '--threshold', '1V', '--tcr', '25ppm'], code: 2, where: '--tcr:', says: /the gain resistors' TCR needs both --tcr and --delta-t; accepted: --tcr 25ppm --delta-t 45/ },
  { args: ['sense', '--limit', '3A', '--topology', 'diff', '--threshold', '1V', '--tcr', '25ppm', '--tracking', '5ppm', '--delta-t', '45'], code: 2, where: '--tracking:', says: /TCR tracking is a network figure; accepted: --ratio-tol with --tracking/ },
  { args: ['sense', '--limit', '3A', '--topology', 'diff', '--threshold', '1V', '--tolerance', '0.1%', '--ratio-tol', '0.05%', '--tcr', '5ppm', '--tracking', '20ppm', '--delta-t', '45'], code: 2, where: '--tracking:', says: /20 ppm\/K is more than twice the 5 ppm\/K --tcr; accepted: a tracking figure at most twice --tcr/ },
  { args: ['sense', '--limit', '3A', '--topology', 'diff', '--threshold', '1V', '--tcr', '25ppm', '--delta-t', '-5'], code: 2, where: '--delta-t:', says: /'-5' is not a temperature difference; accepted: a number of kelvin from 0 to 500/ },
  { args: ['sense', '--limit', '3A', '--threshold', '1V', '--tcr', '25ppm', '--delta-t', '45'], code: 2, where: '--tcr:', says: /counted for the diff topology's R1–R4, not noninv; accepted: --topology diff/ },
  { args: ['divider', '--vref', '1.25', '--vout', '8.4', '--tolerance', '0.1%', '--ratio-tol', '0.5%'], code: 2, where: '--ratio-tol:', says: /0\.50 % is wider than the resistors' 0\.10 % absolute tolerance; accepted: a ratio tolerance at most --tolerance/ },
  { args: ['divider', '--vref', '1.25', '--vout', '8.4', '--delta-t', '45'], code: 2, where: '--delta-t:', says: /the resistors' TCR needs both --tcr and --delta-t; accepted: --tcr 25ppm --delta-t 45/ },
  { args: ['divider', '--vref', '1.25', '--vout', '8.4', '--tcr', '25ppm', '--tracking', '5ppm', '--delta-t', '45'], code: 2, where: '--tracking:', says: /TCR tracking is a network figure; accepted: --ratio-tol with --tracking/ },
  { args: ['divider', '--vref', '1.25', '--vout', '3..12', '--pot', '10k', '--ratio-tol', '0.05%'], code: 2, where: '--ratio-tol:', says: /a network is offered for a fixed divider only; accepted: no --ratio-tol with --pot/ },
  { args: ['sense', '--limit', '3A', '--threshold', '1V', '--ib', '20n±'], code: 2, where: '--ib:', says: /empty current.*; accepted: a current as a typical value/ },
  { args: ['sense', '--limit', '3A', '--threshold', '1V', '--ib', '±1e9'], code: 2, where: '--ib:', says: /outside what trimfree takes as a real part; accepted: .*up to 100 kA/ },
  // sense: impossible requests, each with what to change
  { alone: true, args: ['sense', '--limit', '3A', '--threshold', '6V'], code: 2, where: '--threshold:', says: /above the 4\.80 V it can reach.*; to fix: lower --threshold to at most 4\.00 V, or raise --rail/ },
  { args: ['sense', '--limit', '100mA', '--threshold', '1V', '--vos', '10mV', '--shunts', '1m'], code: 2, where: '--limit:', says: /less than 10× the 10\.0 mV amplifier offset.*; to fix: use a lower-offset part/ },
  { args: ['sense', '--limit', '30A', '--threshold', '1V', '--shunts', '100m'], code: 2, where: '--shunt-rating:', says: /no listed shunt carries 30\.0 A within 50 % of a 1\.00 W rating.*; to fix: raise --shunt-rating/ },
  { args: ['sense', '--limit', '0A', '--threshold', '1V'], code: 2, where: '--limit:', says: /got 0; accepted: a value above zero/ },
  { args: ['sense', '--limit', '3A', '--threshold', '1V', '--topology', 'bridge'], code: 2, where: "option '--topology <name>' argument 'bridge' is invalid", says: /noninv, diff, direct/ },
  { args: ['sense', '--limit', '3A', '--threshold', '1V', '--shunts', '10m,abc'], code: 2, where: '--shunts:', says: /unexpected character 'a' at position 1 in 'abc'/ },
  { args: ['sense', '--limit', '3A', '--threshold', '1V', '--derate', '150%'], code: 2, where: '--derate:', says: /'150%' is out of range; accepted: above 0 % up to 100 %/ },
  { args: ['sense', '--limit', '3A', '--threshold', '1V', '--shunt-tol', '100%'], code: 2, where: '--shunt-tol:', says: /'100%' is out of range; accepted: 0 % to 50 %/ },
  { args: ['sense', '--limit', '3A'], code: 2, where: '--threshold:', says: /no threshold given; accepted: .*--threshold-from/ },
  { args: ['sense', '--limit', '3A', '--threshold', '1V', '--rail', '-5V'], code: 2, where: '--rail:', says: /got -5; accepted: a value above zero/ },
  // spread / grades / design / init / schema
  { args: ['spread', '/nonexistent.json'], code: 2, where: '/nonexistent.json:', says: /no such file; accepted: the path of a design file/ },
  { args: ['spread', 'examples'], code: 2, where: 'examples:', says: /is a folder, not a file/ },
  { alone: true, args: ['spread', CHARGER, '--trials', '1e11'], code: 2, where: '--trials:', says: /'1e11' trials could not finish in any sensible time.*refused before any work/ },
  { args: ['spread', CHARGER, '--trials', '2.5'], code: 2, where: '--trials:', says: /'2\.5' is not a trial count.*accepted: a whole number from 100 to 1e10/ },
  { args: ['spread', CHARGER, '--seed', '4294967296'], code: 2, where: '--seed:', says: /4294967296 is out of range; accepted: a whole number from 0 to 4294967295/ },
  { args: ['spread', CHARGER, '--workers', '0'], code: 2, where: '--workers:', says: /0 is out of range; accepted: a whole number from 1 to 256/ },
  { args: ['spread', CHARGER, '--sample-rows', '0'], code: 2, where: '--sample-rows:', says: /0 is out of range/ },
  { args: ['spread', CHARGER, '--sample-rows', '10000001'], code: 2, where: '--sample-rows:', says: /10000001 is out of range; accepted: a whole number from 1 to 10000000/ },
  { alone: true, args: ['spread', CHARGER, '--report', CHARGER], code: 2, where: '--report:', says: /already exists and would be overwritten; accepted: a new file name, or --force/ },
  { args: ['spread', CHARGER, '--samples', '/nonexistent-dir/x.csv', ...T], code: 2, where: '--samples:', says: /the folder \/nonexistent-dir does not exist/ },
  { args: ['spread', CHARGER, '--report', 'examples', '--force', ...T], code: 2, where: '--report:', says: /examples is a folder, not a file/ },
  { args: ['spread', CHARGER, '--fail-under-yield', '101'], code: 2, where: '--fail-under-yield:', says: /'101' is out of range; accepted: a yield from 0 % to 100 %/ },
  { args: ['spread', CHARGER, '--fail-under-yield', 'abc'], code: 2, where: '--fail-under-yield:', says: /unexpected character 'a'/ },
  { args: ['grades', CHARGER, '--target-yield', '120%'], code: 2, where: '--target-yield:', says: /120% is out of range/ },
  { args: ['grades', CHARGER, '--grades', '5%,3%'], code: 2, where: '--grades:', says: /no grade "3%"; accepted: a comma-separated list of 10%, 5%, 2%, 1%, 0\.5%, 0\.25%, 0\.1%, 0\.05%, 0\.02%, 0\.01%/ },
  { args: ['grades', CHARGER, '--search-trials', '10'], code: 2, where: '--search-trials:', says: /10 is out of range; accepted: a whole number from 1000/ },
  { args: ['grades', LED, '--target-yield', '99.9', ...T, '--search-trials', '1000'], code: 2, where: '--target-yield:', says: /no resistor grade mix reaches 99\.9 %.*even every resistor at 0\.1% gives .*; to fix: lower --target-yield/ },
  { args: ['design', CHARGER, '--target-yield', '40%'], code: 2, where: '--target-yield:', says: /40% is out of range/ },
  { args: ['design', CHARGER, '--report', 'README.md'], code: 2, where: '--report:', says: /README\.md already exists.*--force/ },
  { alone: true, args: ['init', '--kind', 'boost'], code: 2, where: "option '--kind <kind>' argument 'boost' is invalid", says: /charger, bench, led, voltage-only, current-only; see 'trimfree init --help'/ },
  { args: ['init', '--out', 'README.md'], code: 2, where: '--out:', says: /README\.md already exists.*--force/ },
  { args: ['schema', '--out', 'package.json'], code: 2, where: '--out:', says: /package\.json already exists.*--force/ },
  { args: ['init', '--out', '/nonexistent-dir/a.json'], code: 2, where: '--out:', says: /the folder \/nonexistent-dir does not exist/ },
  { alone: true, args: ['frobnicate'], code: 2, where: "unknown command 'frobnicate'", says: /see 'trimfree --help'/ },
  // physically impossible designs (the file's own values): each says what to change
  {
    args: ['spread', chargerWith('below-ref', (d) => (d.voltage.target = '1.0 V')), ...T],
    code: 2,
    where: 'voltage.target:',
    says: /at or below the reference 1\.250 V.*; to fix: ask for an output above Vref/,
  },
  {
    args: ['spread', chargerWith('hot-shunt-auto', (d) => (d.current.shunt = { value: 'R47', rating: '0.5W' })), ...T],
    code: 2,
    where: 'current.shunt.rating:',
    says: /no listed shunt carries 1\.50 A within 50 % of a 500 mW rating.*; to fix: raise current\.shunt\.rating/,
  },
  {
    args: ['spread', chargerWith('hot-shunt', (d) => ((d.current.shunt = { value: 'R47', rating: '0.5W' }), (d.current.gain = { feedback: '1k', ground: '1k' }))), ...T],
    code: 2,
    where: 'current.shunt:',
    says: /dissipates 532 mW at the limit, more than 50 % of its 500 mW rating; to fix: use a smaller shunt/,
  },
  {
    args: ['spread', chargerWith('rail', (d) => (d.current.amplifier.rail = '1V')), ...T],
    code: 2,
    where: 'current.threshold.voltage:',
    says: /above the 800 mV it can reach.*; to fix: lower current\.threshold\.voltage to at most 667 mV, or raise current\.amplifier\.rail/,
  },
  {
    args: ['spread', chargerWith('offset', (d) => ((d.current.shunt = { value: '1m', rating: '1W' }), (d.current.gain = { feedback: '665k', ground: '1k' }), (d.current.amplifier.rail = '12V'))), ...T],
    code: 2,
    where: 'current.shunt:',
    says: /gives 1\.50 mV at the limit, no more than the 2\.00 mV of offset.*; to fix: a larger shunt/,
  },
  {
    // Every candidate's worst-case loss passes the 250 mW budget: R10 reaches 1.584² A²·0.1 Ω = 251 mW.
    args: ['design', chargerWith('all-flagged', (d) => (d.current.shunt.candidates = ['R10', 'R11'])), ...T],
    code: 2,
    where: 'current.shunt.maxLoss:',
    says: /every one of the 2 current-sense candidates loads its shunt past the 250 mW loss limit.*; to fix: raise current\.shunt\.maxLoss to at least 251 mW/,
  },
  {
    args: ['spread', chargerWith('typo', (d) => (d.voltage.tagret = d.voltage.target)), ...T],
    code: 2,
    where: 'voltage.tagret:',
    says: /unknown field 'tagret' \(did you mean 'target'\?\)/,
  },
  {
    args: ['grades', chargerWith('grades-typo', (d) => (d.resistors.grdes = ['1%'])), ...T],
    code: 2,
    where: 'resistors.grdes:',
    says: /unknown field 'grdes' \(did you mean 'grades'\?\)/,
  },
  {
    args: ['grades', chargerWith('grades-unknown', (d) => (d.resistors.grades = ['1%', '3%'])), ...T],
    code: 2,
    where: 'resistors.grades[1]:',
    says: /0\.01%/,
  },
  // the same refusals from a design file name its fields and offer remedies that exist there
  {
    args: ['spread', chargerWith('negative-current', (d) => (d.voltage.search.current = '-1mA..-10uA')), ...T],
    code: 2,
    where: 'voltage.search.current:',
    says: /is not above zero; accepted: LO\.\.HI with 0 < LO ≤ HI/,
  },
  {
    args: ['spread', chargerWith('bias-rule', (d) => ((d.voltage.feedbackBias = '100uA'), (d.voltage.search.bottom = '10k..100k'))), ...T],
    code: 2,
    where: 'voltage.search.bottom:',
    says: /no bottom resistor satisfies.*; to fix: widen voltage\.search\.bottom or voltage\.search\.current, or \(if the feedback-pin rule binds\) use a regulator with a smaller bias current \(voltage\.feedbackBias\)$/,
  },
  {
    args: ['spread', chargerWith('proto', (d) => (d.resistors.overrides = JSON.parse('{"__proto__": {"grade": "5%"}}'))), ...T],
    code: 2,
    where: 'resistors.overrides.__proto__:',
    says: /'__proto__' is not accepted as a field name or designator/,
  },
  // inputs that are not regular files, or too large: refused up front (were: 16.8 GB then std::bad_alloc; a FIFO hung)
  { alone: true, args: ['spread', '/dev/zero'], code: 2, where: '/dev/zero:', says: /is a character device, not a regular file; accepted: the path of a design file \(JSON, a regular file of at most 1 MB\)/ },
  { args: ['nearest', '4k7', '--stock', '/dev/zero'], code: 2, where: '--stock:', says: /'\/dev\/zero' is a character device, not a regular file; accepted: .*at most 50000 lines and 8 MB/ },
  { args: ['spread', fifo('design.fifo')], code: 2, where: `${dir}/design.fifo:`, says: /is a named pipe \(FIFO\), not a regular file/ },
  { args: ['divider', '--vref', '1.25', '--vout', '12', '--stock', fifo('stock.fifo')], code: 2, where: '--stock:', says: /is a named pipe \(FIFO\), not a regular file/ },
  { args: ['spread', fileWith('huge.json', Buffer.alloc(2 ** 20 + 1, 32))], code: 2, where: `${dir}/huge.json:`, says: /is larger than 1 MB, the most accepted/ },
  { args: ['nearest', '4k7', '--stock', stockFile('stock-50001', 50_001)], code: 2, where: '--stock ', says: /the stock list has more than 50000 lines; accepted: .*at most 50000 lines/ },
  // a search over 100 000 shunt candidates took 26.8 s and ignored Ctrl-C: the list is capped
  { args: ['sense', '--limit', '3A', '--threshold', '1V', '--shunts', Array.from({ length: 1001 }, (_, i) => `${20 + i}m`).join(',')], code: 2, where: '--shunts:', says: /1001 values are more than the 1000 the search takes; accepted: a comma-separated list of at most 1000 resistances/ },
  {
    args: ['spread', chargerWith('many-shunts', (d) => (d.current.shunt.candidates = Array.from({ length: 1001 }, (_, i) => `${20 + i / 10}m`))), ...T],
    code: 2,
    where: 'current.shunt.candidates:',
    says: /a list of 1001 is out of range.*; accepted: shunt values to choose from for "auto", at most 1000/,
  },
  // hostile text: control characters shown escaped, long text cut (were: raw ESC/CR/NUL; a 20 MB "line" after 26 s;
  // a 10 MB key is now refused by the 1 MB cap, so the long key here is 900 000 characters)
  { args: ['nearest', '4k7', '--stock', fileWith('esc-stock.txt', '1k\n4\u001b[2J7\n')], code: 2, where: '--stock ', says: /line 2: unexpected character '\\x1b' at position 2 in '4\\x1b\[2J7'/ },
  { args: ['spread', chargerWith('esc-key', (d) => (d.voltage['\u001b]0;owned\u0007\rtrimfree: ok'] = 1)), ...T], code: 2, where: 'voltage.\\x1b]0;owned\\x07\\rtrimfree: ok:', says: /unknown field '\\x1b]0;owned\\x07\\rtrimfree: ok'/ },
  { args: ['spread', chargerWith('long-key', (d) => (d.voltage['k'.repeat(900_000)] = 1)), ...T], code: 2, where: `voltage.${'k'.repeat(79)}…:`, says: /unknown field 'k{79}…'; accepted: the fields of voltage/ },
  { args: ['nearest', `4k7\u0000\u001b[2J`], code: 2, where: 'value:', says: /unexpected character '\\x00' at position 4 in '4k7\\x00\\x1b\[2J'/ },
  {
    // was: "output ilimit: 34 Monte Carlo trials gave no finite value", naming no field. The charger picks RS 75 mΩ: 169 mW at 1.5 A; 9999 K/W × 0.169 W = 1687 K; 75 ppm/K × 1687 K = 13 %
    args: ['spread', chargerWith('runaway', (d) => (d.current.shunt.thermalResistance = '9999 K/W')), ...T],
    code: 2,
    where: 'current.shunt.thermalResistance:',
    says: /θ = 9999 K\/W with 169 mW at the limit heats the shunt 1687 K above ambient, shifting it by 13 % through its ±75 ppm\/K TCR.*; to fix: lower current\.shunt\.thermalResistance/,
  },
  // the yield gate: input fine, design below the bar: exit 1 after the full report
  { alone: true, args: ['spread', LED, ...T, '--fail-under-yield', '100'], code: 1, where: '--fail-under-yield 100 %:', says: /ilimit yield \d+\.\d+ % is below 100 %/ },
];

interface Run {
  status: number | null;
  stdout: string;
  stderr: string;
}

function run(args: string[]): Promise<Run> {
  return new Promise((done) => {
    const child = spawn(process.execPath, [MAIN, ...args], { cwd: PROJECT_ROOT });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d: Buffer) => (stdout += d.toString()));
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    child.on('close', (status) => done({ status, stdout, stderr }));
  });
}

/** One subprocess that runs every row through runCli (the function main.ts calls), capturing each row's output. */
const BATCH_DRIVER = `
import { readFileSync } from 'node:fs';
const { runCli } = await import(process.argv.at(-1));
const rows = JSON.parse(readFileSync(0, 'utf8'));
const results = [];
const write = { out: process.stdout.write.bind(process.stdout), err: process.stderr.write.bind(process.stderr) };
for (const args of rows) {
  let stdout = '';
  let stderr = '';
  process.stdout.write = (chunk) => ((stdout += String(chunk)), true);
  process.stderr.write = (chunk) => ((stderr += String(chunk)), true);
  let outcome;
  try {
    outcome = await runCli(['node', 'trimfree', ...args]);
  } finally {
    process.stdout.write = write.out;
    process.stderr.write = write.err;
  }
  if (outcome.line !== undefined) stderr += 'trimfree: ' + outcome.line + '\\n';
  results.push({ status: outcome.code, stdout, stderr });
}
process.stdout.write(JSON.stringify(results), () => process.exit(0));
`;

function runBatch(rows: Row[]): Promise<Run[]> {
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, ['--input-type=module', '-e', BATCH_DRIVER, join(PROJECT_ROOT, 'dist', 'src', 'cli', 'run.js')], { cwd: PROJECT_ROOT });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (d: Buffer) => (stdout += d.toString()));
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    child.on('close', (status) => (status === 0 ? done(JSON.parse(stdout) as Run[]) : fail(new Error(`batch ended ${status}: ${stderr}`))));
    child.stdin.end(JSON.stringify(rows.map((r) => r.args)));
  });
}

async function runAll(rows: Row[]): Promise<Run[]> {
  const out: Run[] = new Array(rows.length);
  const batched = rows.map((row, i) => ({ row, i })).filter((x) => !x.row.alone);
  const alone = rows.map((row, i) => ({ row, i })).filter((x) => x.row.alone);
  const [batch] = await Promise.all([
    runBatch(batched.map((x) => x.row)),
    ...alone.map(async ({ row, i }) => {
      out[i] = await run(row.args);
    }),
  ]);
  batched.forEach((x, k) => (out[x.i] = batch[k]!));
  return out;
}

describe('bad command-line input: the table (subprocesses: some alone through main.ts, the rest in one batch)', { timeout: 180_000 }, () => {
  it('has at least thirty rows', () => expect(ROWS.length).toBeGreaterThanOrEqual(30));

  let results: Run[] = [];
  it('every row runs', async () => {
    results = await runAll(ROWS);
    expect(ROWS.filter((r) => r.alone).length).toBeGreaterThanOrEqual(8);
    expect(results).toHaveLength(ROWS.length);
  });

  ROWS.forEach((row, i) => {
    it(`trimfree ${row.args.join(' ')} → exit ${row.code}, names ${row.where}${row.alone ? ' (alone)' : ''}`, () => {
      const r = results[i]!;
      expect(r, 'the batch ran').toBeDefined();
      expect(r.status, r.stderr).toBe(row.code);
      const lines = r.stderr.trimEnd().split('\n');
      expect(lines, r.stderr).toHaveLength(1);
      expect(lines[0]!.startsWith(`trimfree: ${row.where}`), lines[0]).toBe(true);
      expect(lines[0]).toMatch(row.says);
      // No stack trace, no internal error, no NaN or Infinity (a given value may be echoed in quotes).
      expect(r.stderr).not.toMatch(/\bat .*\.js:\d+|internal error/);
      // No raw control character (a hostile file must not drive the terminal), and a line a person can read.
      expect(r.stderr.replace(/\n$/, '')).not.toMatch(/[\u0000-\u001f\u007f]/);
      expect(lines[0]!.length).toBeLessThan(1000);
      expect(`${r.stdout}\n${r.stderr}`.replace(/'[^']*'/g, '')).not.toMatch(/NaN|Infinity/);
      // Exit 2 prints nothing on stdout; the yield gate prints the full report first.
      if (row.code === 2) expect(r.stdout).toBe('');
      else expect(r.stdout).toMatch(/== ilimit/);
    });
  });
});
