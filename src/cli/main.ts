import { runPlanCommand } from './plan-command.js';

/** Entry of `npm run plan`; see `USAGE` in plan-command.ts. */
const code = await runPlanCommand(process.argv.slice(2), {
  stdout: (text) => process.stdout.write(text),
  stderr: (text) => process.stderr.write(text),
  interactive: process.stderr.isTTY === true,
});
process.exit(code);
