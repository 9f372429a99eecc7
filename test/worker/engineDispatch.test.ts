import { describe, expect, it } from 'vitest';
import { parseWaveformConfig } from '../../src/config/configParse';
import { createHash } from 'node:crypto';
import { generateWaveform } from '../../src/dsp/waveform/waveformGenerator';
import { exportToMemory } from '../../src/io/exportMemory';
import { createEngineDispatcher, packWaveform, summarizePlan } from '../../src/worker/engineDispatch';
import { PROTOCOL_VERSION, waveformBufferKeys, type WorkerResponse } from '../../src/worker/protocol';

// The worker must add nothing of its own (STYLE.md §5): what it posts is exactly what
// parseWaveformConfig + generateWaveform return, buffers moved rather than copied.

/** A small LTE 1.4 MHz uplink (6 RB, FFT 128; TS 36.101 Table 5.6-1) keeps each run to a few ms. */
const smallConfig = { standard: 'lte', link: 'uplink', bandwidthMHz: 1.4, symbols: 2, modulation: '16qam' };

interface Posted {
  message: WorkerResponse;
  transfer: Transferable[];
}

function createHarness() {
  const posted: Posted[] = [];
  const tasks: (() => void)[] = [];
  const dispatch = createEngineDispatcher({
    post: (message, transfer) => posted.push({ message, transfer }),
    schedule: (task) => tasks.push(task),
    now: () => 0,
  });
  const runTasks = () => tasks.splice(0, tasks.length).forEach((task) => task());
  return { posted, dispatch, runTasks };
}

const generate = (id: number, config: unknown = smallConfig) => ({
  type: 'generate',
  id,
  protocolVersion: PROTOCOL_VERSION,
  config,
});

describe('engine dispatcher', () => {
  it('posts exactly what the engine generates, with every buffer in the transfer list', () => {
    const { posted, dispatch, runTasks } = createHarness();
    dispatch(generate(1));
    expect(posted).toHaveLength(0); // queued for one task turn so newer requests can overtake it
    runTasks();
    expect(posted).toHaveLength(1);
    const { message, transfer } = posted[0]!;
    if (message.type !== 'generated') throw new Error(`expected generated, got ${message.type}`);
    const expected = generateWaveform(parseWaveformConfig(smallConfig));
    expect(message.config).toEqual(parseWaveformConfig(smallConfig));
    expect(new Float64Array(message.buffers.waveformIq)).toEqual(expected.waveformIq);
    expect(new Float64Array(message.buffers.dataSymbolsIq)).toEqual(expected.dataSymbolsIq);
    expect(new Uint8Array(message.buffers.gridKinds)).toEqual(expected.gridKinds);
    expect(message.meta.symbolLayout).toEqual(expected.symbolLayout);
    expect(message.meta.summary).toEqual(summarizePlan(expected.plan));
    expect(new Set(transfer)).toEqual(new Set(waveformBufferKeys.map((key) => message.buffers[key])));
    expect(() => structuredClone(message, { transfer })).not.toThrow();
  });

  it('copies a buffer it cannot move whole (a subarray view) instead of transferring its parent', () => {
    const waveform = generateWaveform(parseWaveformConfig(smallConfig));
    const shared = new Float64Array(waveform.waveformIq.length + 8);
    shared.set(waveform.waveformIq, 4);
    const view = shared.subarray(4, 4 + waveform.waveformIq.length);
    const { buffers } = packWaveform({ ...waveform, waveformIq: view });
    expect(buffers.waveformIq).not.toBe(shared.buffer);
    expect(new Float64Array(buffers.waveformIq)).toEqual(waveform.waveformIq);
  });

  it('returns INVALID_CONFIG with the schema issues for a bad field', () => {
    const { posted, dispatch, runTasks } = createHarness();
    dispatch(generate(4, { ...smallConfig, oversampling: 17 }));
    runTasks();
    const { message } = posted[0]!;
    expect(message).toMatchObject({ type: 'error', id: 4, code: 'INVALID_CONFIG' });
    if (message.type !== 'error') return;
    expect(message.message).toContain('oversampling');
    expect(message.details?.issues).toEqual([expect.objectContaining({ path: 'oversampling' })]);
  });

  it('drops a generate request that a newer one overtook, and a cancelled one', () => {
    const { posted, dispatch, runTasks } = createHarness();
    dispatch(generate(1));
    dispatch(generate(2));
    runTasks();
    expect(posted.map((p) => `${p.message.type}:${p.message.id}`)).toEqual(['generated:2']);

    dispatch(generate(3));
    dispatch({ type: 'cancel', id: 4, protocolVersion: PROTOCOL_VERSION, targetId: 3 });
    runTasks();
    expect(posted).toHaveLength(1);
  });

  it('builds an export with the same src/io code and bytes as the CLI, moving the data buffer', () => {
    const { posted, dispatch, runTasks } = createHarness();
    const options = { format: 'sigmf-ci16', level: { mode: 'rms', levelDbfs: -15 } };
    dispatch({ type: 'export', id: 9, protocolVersion: PROTOCOL_VERSION, config: smallConfig, options });
    runTasks();
    const { message, transfer } = posted[0]!;
    if (message.type !== 'exported') throw new Error(`expected exported, got ${message.type}`);
    const expected = exportToMemory(parseWaveformConfig(smallConfig), options as Parameters<typeof exportToMemory>[1]);
    expect(new Uint8Array(message.data)).toEqual(expected.data);
    expect(message.metaText).toBe(expected.metaText);
    expect(message.sha512Hex).toBe(expected.sha512Hex);
    // SHA-512 of the data, by node:crypto (independent of src/io/sha512.ts).
    expect(createHash('sha512').update(new Uint8Array(message.data)).digest('hex')).toBe(message.sha512Hex);
    expect(message.report.rmsDbfs).toBeCloseTo(-15, 1);
    expect(transfer).toEqual([message.data]);
  });

  it('does not hold a newer generate back behind an export, nor drop either', () => {
    const { posted, dispatch, runTasks } = createHarness();
    dispatch({ type: 'export', id: 1, protocolVersion: PROTOCOL_VERSION, config: smallConfig, options: {} });
    dispatch(generate(2));
    runTasks();
    expect(posted.map((p) => `${p.message.type}:${p.message.id}`)).toEqual(['exported:1', 'generated:2']);
  });

  it('refuses a message from another protocol version or of unknown shape', () => {
    const { posted, dispatch } = createHarness();
    dispatch({ ...generate(7), protocolVersion: PROTOCOL_VERSION + 1 });
    dispatch({ hello: 'worker' });
    expect(posted.map((p) => p.message)).toEqual([
      expect.objectContaining({ type: 'error', id: 7, code: 'INTERNAL', message: expect.stringContaining('reload the page') }),
      expect.objectContaining({ type: 'error', id: -1, code: 'INTERNAL' }),
    ]);
  });
});
