import { describe, expect, it } from 'vitest';
import { parseWaveformConfigJson } from '../../../src/config/configParse';
import { demoScenarios } from '../../../src/scenarios/demoScenario';
import { configFileName, formatConfigJson, parseConfigFile } from '../../../src/ui/persist/configFile';
import { decodeConfigHash, encodeConfigHash } from '../../../src/ui/persist/permalink';
import { MemoryRecordStore } from '../../../src/ui/persist/recordStore';
import { createWorkspaceArchive, KEEP_SNAPSHOTS, type Workspace } from '../../../src/ui/persist/workspaceArchive';

const workspace = (name: string): Workspace => ({
  scenarios: [{ id: 'a', name, description: '', config: { modulation: '16qam' }, pinnedAtMs: 1 }],
  baselineId: 'a',
  current: { name, description: 'd', config: { bandwidthMHz: 5 } },
});

describe('permalink', () => {
  it('round-trips a configuration, including non-ASCII text, through a URL-safe hash', () => {
    const config = { ...demoScenarios[0]!.config, data: { source: 'bits', hex: 'A5 F0' } };
    const hash = encodeConfigHash(config);
    expect(hash).toMatch(/^#config=[A-Za-z0-9_-]+$/);
    expect(decodeConfigHash(hash)).toEqual({ kind: 'config', config });
    expect(decodeConfigHash(encodeConfigHash({ note: 'Δf µs π/2' }))).toEqual({ kind: 'config', config: { note: 'Δf µs π/2' } });
  });

  it('ignores other hashes and says why a damaged one cannot be read', () => {
    expect(decodeConfigHash('')).toEqual({ kind: 'none' });
    expect(decodeConfigHash('#plots')).toEqual({ kind: 'none' });
    const damaged = decodeConfigHash('#config=eyJiYW5k');
    expect(damaged.kind).toBe('invalid');
    expect(damaged.kind === 'invalid' && damaged.message).toContain("link's configuration could not be read");
  });
});

describe('configuration files', () => {
  it('writes the JSON the CLI reads', () => {
    const text = formatConfigJson(demoScenarios[0]!.config);
    expect(text.endsWith('}\n')).toBe(true);
    expect(parseWaveformConfigJson(text)).toMatchObject({ bandwidthMHz: 10, modulation: '16qam' });
  });

  it('reads a file, keeping schema problems for the form, and refuses what is not a configuration', () => {
    expect(parseConfigFile('{"oversampling": 17}', 'a.json')).toEqual({
      ok: true,
      config: { oversampling: 17 },
      issues: [{ path: 'oversampling', message: 'must be a whole number from 1 to 16' }],
    });
    expect(parseConfigFile('[1]', 'b.json')).toMatchObject({ ok: false, message: expect.stringContaining('one configuration object') });
    expect(parseConfigFile('{', 'c.json')).toMatchObject({ ok: false, message: expect.stringContaining('c.json is not valid JSON') });
  });

  it('makes a file name from a scenario name', () => {
    expect(configFileName('Saltway uplink, OFDM (comparison)')).toBe('saltway-uplink-ofdm-comparison.json');
    expect(configFileName('  ')).toBe('crestline-config.json');
  });
});

describe('workspace archive', () => {
  it('restores the newest snapshot', async () => {
    const store = new MemoryRecordStore<unknown>();
    const archive = createWorkspaceArchive(store);
    expect(await archive.load()).toBeNull();
    await archive.save(workspace('first'), 10);
    await archive.save(workspace('second'), 20);
    const loaded = await archive.load();
    expect(loaded).toMatchObject({ savedAtMs: 20, current: { name: 'second' } });
  });

  it('keeps the older snapshots when a save fails, and reports the failure', async () => {
    const store = new MemoryRecordStore<unknown>();
    const archive = createWorkspaceArchive(store);
    await archive.save(workspace('kept'), 10);
    store.failNextAppends = 1;
    const outcome = await archive.save(workspace('lost'), 20);
    expect(outcome).toEqual({ ok: false, message: expect.stringContaining('QuotaExceededError') });
    expect(store.size).toBe(1);
    expect(await archive.load()).toMatchObject({ current: { name: 'kept' } });
  });

  it('prunes only after a newer snapshot was written, keeping the last few', async () => {
    const store = new MemoryRecordStore<unknown>();
    const archive = createWorkspaceArchive(store);
    for (let i = 0; i < KEEP_SNAPSHOTS + 3; i++) await archive.save(workspace(`s${i}`), i);
    expect(store.size).toBe(KEEP_SNAPSHOTS);
    const names = (await store.readAll()).map((r) => (r.value as Workspace).current.name);
    expect(names).toEqual(Array.from({ length: KEEP_SNAPSHOTS }, (_, i) => `s${i + 3}`));
  });

  it('skips a damaged newest record and restores the one before', async () => {
    const store = new MemoryRecordStore<unknown>();
    const archive = createWorkspaceArchive(store);
    await archive.save(workspace('good'), 1);
    await store.append({ format: 'crestline-workspace', version: 1, scenarios: 'oops' });
    expect(await archive.load()).toMatchObject({ current: { name: 'good' } });
  });

  it('runs saves in order, so a slow earlier save cannot prune a later one', async () => {
    const store = new MemoryRecordStore<unknown>();
    const archive = createWorkspaceArchive(store);
    const saves = Array.from({ length: 8 }, (_, i) => archive.save(workspace(`s${i}`), i));
    const outcomes = await Promise.all(saves);
    expect(outcomes.every((o) => o.ok)).toBe(true);
    expect(await archive.load()).toMatchObject({ current: { name: 's7' } });
  });
});
