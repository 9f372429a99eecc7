/**
 * The worker's export request: validate the configuration, then build the files with src/io's
 * exportToMemory — the same pipeline `crestline generate` streams to disk, so the bytes match.
 * The worker adds nothing: it moves the data buffer and passes the report through.
 */
import { parseWaveformConfig } from '../../config/configParse';
import { exportToMemory } from '../../io/exportMemory';
import { PROTOCOL_VERSION, type ExportedResponse, type ExportRequest } from '../protocol';
import type { EngineDispatchHost, HandlerOutput } from '../engineDispatch';

export function runExportRequest(request: ExportRequest, startMs: number, host: EngineDispatchHost): HandlerOutput {
  const config = parseWaveformConfig(request.config);
  const built = exportToMemory(config, (request.options ?? {}) as Parameters<typeof exportToMemory>[1]);
  // The data view spans its own buffer (exportToMemory allocates it whole), so it can be moved.
  const data =
    built.data.byteOffset === 0 && built.data.byteLength === built.data.buffer.byteLength && built.data.buffer instanceof ArrayBuffer
      ? built.data.buffer
      : built.data.slice().buffer;
  const response: ExportedResponse = {
    type: 'exported',
    id: request.id,
    protocolVersion: PROTOCOL_VERSION,
    data,
    metaText: built.metaText,
    dataSuffix: built.dataSuffix,
    metaSuffix: built.metaSuffix,
    sha512Hex: built.sha512Hex,
    dataBytes: built.dataBytes,
    report: built.report,
    elapsedMs: host.now() - startMs,
  };
  return { response, transfer: [data] };
}
