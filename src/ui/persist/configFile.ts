/**
 * Configurations as files: the same JSON the CLI reads (`crestline generate --config FILE`), so any
 * screen can be reproduced from the shell. Pure text in, text out; the download lives in ui/download.ts.
 */
import { checkConfigSchema, type ConfigIssue } from '../../config/schemaIssues';

/** Pretty JSON with a trailing newline, as a person would keep it in version control. */
export function formatConfigJson(config: unknown): string {
  return `${JSON.stringify(config, null, 2)}\n`;
}

export type ParsedConfigFile = { ok: true; config: Record<string, unknown>; issues: ConfigIssue[] } | { ok: false; message: string };

/**
 * Reads a configuration file. JSON that is not an object is refused; an object with schema problems
 * is returned with its issues, so the form can show them at their fields.
 */
export function parseConfigFile(text: string, fileName: string): ParsedConfigFile {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    return { ok: false, message: `${fileName} is not valid JSON: ${error instanceof Error ? error.message : String(error)}` };
  }
  if (json === null || typeof json !== 'object' || Array.isArray(json)) {
    return { ok: false, message: `${fileName} must hold one configuration object ({ … }), as the CLI's --config file does.` };
  }
  return { ok: true, config: json as Record<string, unknown>, issues: checkConfigSchema(json).issues };
}

/** A file name from a scenario name: letters, digits and dashes, ending in .json. */
export function configFileName(name: string): string {
  const stem = name
    .normalize('NFKD')
    .replace(/[^\w\s-]/g, '')
    .trim()
    .replace(/[\s_]+/g, '-')
    .toLowerCase();
  return `${stem === '' ? 'crestline-config' : stem}.json`;
}
