import type { CliCommand } from './types';
import { renderCommand } from './render';

/** Every command of the command line; each module adds its own entries here. */
export const COMMANDS: CliCommand[] = [];
COMMANDS.push(renderCommand);
import { interventionCommands } from './interventions';
COMMANDS.push(...interventionCommands);
import { orderingCommands } from './ordering';
COMMANDS.unshift(...orderingCommands);
import { numericCommands } from './numeric';
COMMANDS.push(...numericCommands);
import { curveCommands } from './curves';
COMMANDS.push(...curveCommands);
import { studyCommands } from './study';
COMMANDS.push(...studyCommands);
import { dataCommands } from './data';
COMMANDS.push(...dataCommands);
import { pictureCommands } from './pictures';
COMMANDS.push(...pictureCommands);
import { undersampleCommands } from './undersample'; COMMANDS.push(...undersampleCommands);
import { batchCommand } from './batch';
COMMANDS.push(batchCommand((argv, io) => import('../run').then((m) => m.runCli(argv, io))));
import { cointCommands } from './coint'; COMMANDS.push(...cointCommands);
import { rehearseCommands } from './rehearse'; COMMANDS.push(...rehearseCommands);
