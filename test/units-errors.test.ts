// Malformed or ambiguous notation is an InputError naming the offending character and its 1-based position,
// carrying the `where` it was given and a list of accepted forms; never a guessed value.
import { describe, expect, it } from 'vitest';
import { InputError } from '../src/errors.js';
import { parseCurrent, parsePercent, parsePower, parsePpmPerK, parseResistance, parseVoltage } from '../src/units/index.js';

function errorOf(run: () => unknown): InputError {
  try {
    run();
  } catch (error) {
    if (error instanceof InputError) return error;
    throw error;
  }
  throw new Error('expected an InputError, got a value');
}

describe('malformed notation names the character', () => {
  it.each([
    ['4x7', "unexpected character 'x' at position 2 in '4x7'"],
    ['4K7K', "unexpected character 'K' at position 4 in '4K7K'"],
    ['4K7F', "unexpected character 'F' at position 4 in '4K7F'"],
    ['1meg', "unexpected character 'e' at position 3 in '1meg'"],
    ['1..2', "unexpected character '.' at position 3 in '1..2'"],
    ['1,5k', "unexpected character ',' at position 2 in '1,5k'"],
    ['4r7', "unexpected character 'r' at position 2 in '4r7'"],
    ['12V', "unexpected character 'V' at position 3 in '12V'"],
    ['k', "unexpected character 'k' at position 1 in 'k'"],
    ['1 k 5', "unexpected character ' ' at position 4 in '1 k 5'"],
    ['1e', "unexpected character 'e' at position 2 in '1e'"],
    ['4.7 k ohms', "unexpected character ' ' at position 6 in '4.7 k ohms'"],
  ])('resistance %j → %s', (text, message) => {
    const error = errorOf(() => parseResistance(text, '--rtop'));
    expect(error.message).toBe(message);
    expect(error.where).toBe('--rtop');
    expect(error.accepted).toMatch(/4K7/);
  });
  it('a voltage parser rejects a current unit and the reverse', () => {
    expect(errorOf(() => parseVoltage('5mA', '--vout')).message).toBe("unexpected character 'A' at position 3 in '5mA'");
    expect(errorOf(() => parseCurrent('5V', '--ilimit')).message).toBe("unexpected character 'V' at position 2 in '5V'");
    expect(errorOf(() => parsePower('1 Wx', '--p')).message).toBe("unexpected character 'W' at position 3 in '1 Wx'");
  });
  it('percent and ppm/K name the character', () => {
    expect(errorOf(() => parsePercent('1x%', '--tol')).message).toBe("unexpected character 'x' at position 2 in '1x%'");
    expect(errorOf(() => parsePercent('1 %%', '--tol')).message).toBe("unexpected character '%' at position 4 in '1 %%'");
    expect(errorOf(() => parsePpmPerK('100ppm/X', '--tcr')).message).toBe("unexpected character 'X' at position 8 in '100ppm/X'");
    expect(errorOf(() => parsePpmPerK('100 ppb', '--tcr')).message).toBe("unexpected character 'b' at position 7 in '100 ppb'");
  });
});

describe('values that cannot be a resistance', () => {
  it.each(['0', '0R', '-1k', '-1', '0.0 kΩ'])('%j is rejected as not greater than zero', (text) => {
    expect(errorOf(() => parseResistance(text, 'value')).message).toMatch(/greater than zero/);
  });
  it('empty text, overflow and NaN-looking text are errors, never NaN or Infinity', () => {
    expect(errorOf(() => parseResistance('', 'value')).message).toBe('empty resistance');
    expect(errorOf(() => parseResistance('1e999', 'value')).message).toBe("'1e999' is out of range");
    expect(errorOf(() => parseResistance('NaN', 'value')).message).toMatch(/unexpected character 'N'/);
    expect(errorOf(() => parseResistance('Infinity', 'value')).message).toMatch(/unexpected character 'I'/);
    expect(errorOf(() => parsePower('0 W', '--p')).message).toMatch(/greater than zero/);
  });
  it('a negative tolerance is refused unless the caller allows a sign', () => {
    expect(errorOf(() => parsePercent('-1%', '--tol')).message).toMatch(/must not be negative/);
    expect(errorOf(() => parsePpmPerK('-50', '--tcr')).message).toMatch(/must not be negative/);
  });
});
