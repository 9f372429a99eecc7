import { Command, CommanderError } from 'commander';
import { reportCliError } from './cliErrors';
import { registerAnalyze } from './commands/analyze';
import { registerBackoff } from './commands/backoff';
import { registerGenerate } from './commands/generate';
import { registerInspect } from './commands/inspect';
import { registerLink } from './commands/link';
import { registerMeasure } from './commands/measure';
import { registerMerge } from './commands/merge';

/** Every subcommand registers itself here; each lives in src/cli/commands/<name>.ts. */
const COMMANDS: readonly ((program: Command, io: CliIo) => void)[] = [registerGenerate, registerInspect, registerAnalyze, registerLink, registerBackoff, registerMeasure, registerMerge];

/** Where a command prints; tests pass their own. */
export interface CliIo {
  readonly stdout: (line: string) => void;
  readonly stderr: (line: string) => void;
}

const processIo: CliIo = {
  stdout: (line) => process.stdout.write(`${line}\n`),
  stderr: (line) => process.stderr.write(`${line}\n`),
};

/** Runs the CLI with `argv` (node, script, args…) and returns the exit code. */
export async function main(argv: readonly string[], io: CliIo = processIo): Promise<number> {
  const program = new Command('crestline')
    .description('Crestline: OFDM / DFT-s-OFDM waveform engine (generate, measure, export, analyze)')
    .option('--verbose', 'print stack traces on errors')
    .exitOverride()
    .configureOutput({ writeOut: (s) => io.stdout(s.trimEnd()), writeErr: (s) => io.stderr(s.trimEnd()) });
  for (const register of COMMANDS) register(program, io);
  try {
    await program.parseAsync([...argv]);
    return 0;
  } catch (err) {
    if (err instanceof CommanderError) return err.exitCode === 0 ? 0 : 2;
    return reportCliError(err, Boolean(program.opts().verbose) || argv.includes('--verbose'), io.stderr);
  }
}
