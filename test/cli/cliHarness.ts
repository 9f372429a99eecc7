import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/main';

/** Runs the CLI in-process with captured output. */
export async function runCli(args: readonly string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  const out: string[] = [];
  const err: string[] = [];
  const code = await main(['node', 'crestline', ...args], { stdout: (l) => out.push(l), stderr: (l) => err.push(l) });
  return { code, stdout: out.join('\n'), stderr: err.join('\n') };
}

/** A fresh temporary directory with a config file in it. */
export function workDir(config: unknown): { dir: string; configPath: string } {
  const dir = mkdtempSync(join(tmpdir(), 'crestline-cli-'));
  const configPath = join(dir, 'cfg.json');
  writeFileSync(configPath, JSON.stringify(config));
  return { dir, configPath };
}
