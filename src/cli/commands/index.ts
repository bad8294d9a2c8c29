/** The command table. Each command lives in its own file; add one line here per command. */
import type { Command } from '../io';
import { inspectCommand } from './inspect';
import { exportCommand } from './export';
import { analyzeCommand } from './analyze';
import { predictCommand } from './predict';
import { qcCommand } from './qc';
import { historyCommand } from './history';
import { simulateCommand } from './simulate';
import { whatifCommand } from './whatif';

export const commands: Command[] = [
  inspectCommand,
  exportCommand,
  predictCommand,
  analyzeCommand,
  qcCommand,
  historyCommand,
  simulateCommand,
  whatifCommand,
];
