// The pickers speak in command-line option names (--vout); in a design file the same value lives in a field
// (voltage.target). This rewrites an error's place and remedy so the designer is pointed at the file.
import { ImpossibleError, InputError } from '../errors.js';

function rewrite(text: string, fields: Record<string, string>): string {
  return text.replace(/--[a-z][a-z-]*/g, (option) => fields[option] ?? option);
}

/** Runs a picker; its InputError/ImpossibleError come back with design-file field paths in place of options. */
export function mapPickerError<T>(run: () => T, fields: Record<string, string>): T {
  try {
    return run();
  } catch (error) {
    if (error instanceof InputError) throw new InputError(rewrite(error.where, fields), rewrite(error.message, fields), rewrite(error.accepted, fields));
    if (error instanceof ImpossibleError) throw new ImpossibleError(rewrite(error.where, fields), rewrite(error.message, fields), rewrite(error.remedy, fields));
    throw error;
  }
}
