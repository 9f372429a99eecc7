import { describe, expect, it, vi } from 'vitest';
import { parseWaveformConfig } from '../../src/config/configParse';
import { DspError } from '../../src/dsp/errors';
import { generateWaveform } from '../../src/dsp/waveform/waveformGenerator';
import { createEngineClient, isSuperseded, SupersededError, type EngineRestartNotice } from '../../src/worker/client';
import { InProcessWorker } from './inProcessWorker';

// The client against the real dispatcher and engine over structured clone (see inProcessWorker.ts).

/** LTE 1.4 MHz uplink, 6 RB (TS 36.101 Table 5.6-1): small and quick. */
const smallConfig = { standard: 'lte', bandwidthMHz: 1.4, symbols: 2 };

function setup(workerOptions: ConstructorParameters<typeof InProcessWorker>[0] = {}) {
  const workers: InProcessWorker[] = [];
  const notices: EngineRestartNotice[] = [];
  const client = createEngineClient({
    createWorker: () => {
      const worker = new InProcessWorker(workerOptions);
      workers.push(worker);
      return worker;
    },
    onRestart: (notice) => notices.push(notice),
  });
  return { client, workers, notices };
}

describe('engine client', () => {
  it('resolves with the validated config and the engine’s waveform, typed arrays rebuilt', async () => {
    const { client } = setup();
    const result = await client.generate(smallConfig);
    const expected = generateWaveform(parseWaveformConfig(smallConfig));
    expect(result.config).toEqual(parseWaveformConfig(smallConfig));
    expect(result.waveform.waveformIq).toBeInstanceOf(Float64Array);
    expect(result.waveform.gridKinds).toBeInstanceOf(Uint8Array);
    expect(result.waveform.waveformIq).toEqual(expected.waveformIq);
    expect(result.waveform.bits).toEqual(expected.bits);
    expect(result.waveform.numSamples).toBe(expected.numSamples);
    expect(result.waveform.summary.numerology).toEqual(expected.plan.numerology);
    expect(result.elapsedMs).toBeGreaterThanOrEqual(0);
    client.dispose();
  });

  it('rebuilds a DspError with code, message and field issues', async () => {
    const { client } = setup();
    const failure = client.generate({ ...smallConfig, bandwidthMHz: 7 }).catch((error: unknown) => error);
    const error = await failure;
    expect(error).toBeInstanceOf(DspError);
    expect(error).toMatchObject({ code: 'INVALID_CONFIG', message: expect.stringContaining('bandwidth') });
    expect((error as DspError).details?.issues).toEqual([expect.objectContaining({ path: 'bandwidthMHz' })]);
    client.dispose();
  });

  it('lets the newest request win: the older one is superseded and its answer ignored', async () => {
    const { client, workers } = setup();
    const first = client.generate({ ...smallConfig, modulation: 'qpsk' }).catch((error: unknown) => error);
    const second = client.generate({ ...smallConfig, modulation: '64qam' });
    expect(isSuperseded(await first)).toBe(true);
    expect((await second).config.modulation).toBe('64qam');
    // The stale request was already running on the first worker; the new one went to the second.
    expect(workers.map((w) => w.received.map((m) => m.type))).toEqual([['generate'], ['generate']]);
    const third = client.generate({ ...smallConfig, modulation: '16qam' });
    const fourth = client.generate({ ...smallConfig, modulation: '256qam' });
    await expect(third).rejects.toBeInstanceOf(SupersededError);
    expect((await fourth).config.modulation).toBe('256qam');
    client.dispose();
  });

  it('reports a crash, rejects the pending request and starts a fresh worker', async () => {
    const { client, workers, notices } = setup();
    await client.generate(smallConfig); // the first worker is up and ready
    const pending = client.generate(smallConfig).catch((error: unknown) => error);
    workers[0]!.crash('out of memory');
    const error = await pending;
    expect(error).toBeInstanceOf(DspError);
    expect(error).toMatchObject({ code: 'INTERNAL', message: expect.stringContaining('crashed (out of memory)') });
    expect(notices).toEqual([{ reason: 'out of memory', failedRequestIds: [2], restartCount: 1 }]);
    expect(workers).toHaveLength(2);
    expect(workers[0]!.terminated).toBe(true);
    const after = await client.generate(smallConfig);
    expect(after.waveform.numSamples).toBeGreaterThan(0);
    client.dispose();
  });

  it('does not restart in a loop when a worker dies before it is ready', async () => {
    const { client, workers, notices } = setup({ sendReady: false });
    const pending = client.generate(smallConfig).catch((error: unknown) => error);
    workers[0]!.crash('script failed to load');
    await pending;
    await new Promise((resolve) => setTimeout(resolve, 5));
    expect(notices).toHaveLength(1);
    expect(workers).toHaveLength(1); // the next request starts the next worker
    client.dispose();
  });

  it('refuses a worker from another build (protocol version)', async () => {
    const { client } = setup({ protocolVersion: 99 });
    const error = await client.generate(smallConfig).catch((e: unknown) => e);
    expect(error).toMatchObject({ code: 'INTERNAL', message: expect.stringContaining('protocol v99') });
    client.dispose();
  });

  it('turns a configuration that cannot be cloned into INVALID_CONFIG', async () => {
    const { client } = setup();
    const error = await client.generate({ ...smallConfig, symbols: () => 3 }).catch((e: unknown) => e);
    expect(error).toMatchObject({ code: 'INVALID_CONFIG', message: expect.stringContaining('plain JSON') });
    client.dispose();
  });

  it('settles pending requests as superseded on dispose', async () => {
    const { client, workers } = setup();
    const onSettled = vi.fn();
    const pending = client.generate(smallConfig).catch((error: unknown) => onSettled(isSuperseded(error)));
    client.dispose();
    await pending;
    expect(onSettled).toHaveBeenCalledWith(true);
    expect(workers[0]!.terminated).toBe(true);
  });
});
