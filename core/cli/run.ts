/** The command line's entry as the launcher runs it (launch.mjs): the command in process.argv. */
import { runFromArgv } from './main.ts';

runFromArgv();
