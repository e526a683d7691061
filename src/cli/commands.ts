// The list of subcommands. Each module exports a factory returning its commander Command;
// add one import and one entry here to register a new command.
import type { Command } from 'commander';
import { designCommand } from './design.js';
import { dividerCommand } from './divider.js';
import { gradesCommand } from './grades.js';
import { initCommand } from './init.js';
import { nearestCommand } from './nearest.js';
import { pilotCommand } from './pilot.js';
import { schemaCommand } from './schema.js';
import { senseCommand } from './sense.js';
import { spreadCommand } from './spread.js';
import { valuesCommand } from './values.js';

export const commandFactories: Array<() => Command> = [valuesCommand, nearestCommand, dividerCommand, senseCommand, spreadCommand, gradesCommand, designCommand, pilotCommand, initCommand, schemaCommand];
