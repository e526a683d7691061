// Whether terminal output may carry colour: only when stdout is a terminal, and never when the NO_COLOR environment
// variable is set to anything but the empty string (the convention documented at no-color.org).
export function colourWanted(stream: { isTTY?: boolean }, env: NodeJS.ProcessEnv = process.env): boolean {
  const noColour = env['NO_COLOR'];
  if (noColour !== undefined && noColour !== '') return false;
  return stream.isTTY === true;
}
