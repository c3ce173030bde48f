// The `survey` command module; src/cli/main.ts wires it to the command line.
export { surveyCommand, type SurveyCommandOptions } from './survey-command.js';
