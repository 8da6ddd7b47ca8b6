// Runs `fray run FILE --json [flags]` in this process (the same code path as bin/fray.js) and
// prints the peak resident set size in bytes (all threads) as the last line of stdout.
import { loadCli } from '../../bin/loadCli.js';

const { main } = loadCli();

const sink = { write: () => true };
const code = await main(['run', ...process.argv.slice(2), '--json'], { stdout: sink, stderr: process.stderr });
if (code !== 0) process.exit(code);
console.log(String(process.resourceUsage().maxRSS * 1024));
