export { CliError, describeError } from "./cliError";
export { integerList, integerOption, parseOptions, requireString } from "./options";
export { readJsonFile, readMatrixFile, readTextFile } from "./readInput";
export { runCommand } from "./runCommand";
export { LIMIT_OPTIONS, limitFlag, limitsFrom } from "./limitOptions";
