// The `trend` command module; src/cli/main.ts wires it to the command line.
export { trendCommand, type TrendCommandOptions } from './trend-command.js';
