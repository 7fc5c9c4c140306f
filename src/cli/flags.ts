/**
 * Flag parsing errors in the CLI's own words: node:util parseArgs throws with codes; these
 * become InputError (exit 2) naming the flag and where to look for help.
 */
import { InputError, messageOf } from './io.js';

/**
 * Runs a parseArgs call and turns its errors into InputError.
 * @param command the command whose help the message points to
 * @throws InputError for an unknown flag, a missing value or a value given to a switch
 */
export function parseFlags<T>(parse: () => T, command: string): T {
  try {
    return parse();
  } catch (err) {
    const code = (err as { code?: unknown }).code;
    if (typeof code !== 'string' || !code.startsWith('ERR_PARSE_ARGS')) throw err;
    const flag = /'(-[^' ]+)/.exec(messageOf(err))?.[1];
    const help = `see lapwright ${command} --help`;
    if (code === 'ERR_PARSE_ARGS_UNKNOWN_OPTION' && flag) throw new InputError(`unknown option ${flag} (${help})`);
    throw new InputError(`${messageOf(err)} (${help})`);
  }
}
