import type { ExportedFiles } from '../../worker/client';

const dB = (value: number, digits = 2) => (Number.isFinite(value) ? `${value.toFixed(digits)}` : '–');
const bytes = (n: number) => (n >= 1 << 20 ? `${(n / (1 << 20)).toFixed(2)} MiB` : n >= 1024 ? `${(n / 1024).toFixed(1)} KiB` : `${n} B`);

/** What the export will write: level, peak, clipping, checksum and warnings, before anything is saved. */
export function ExportReportView({ files }: { files: ExportedFiles }) {
  const r = files.report;
  const q = r.quantisation;
  const rows: [string, string, string?][] = [
    ['Format', `${r.format} (${r.datatype})`],
    ['Sample rate', `${(r.sampleRateHz / 1e6).toFixed(6).replace(/0+$/, '').replace(/\.$/, '')} Msps`],
    ['Samples', `${r.numSamples.toLocaleString('en')} (${(r.durationS * 1e3).toFixed(3)} ms)`],
    ['Files', `data ${bytes(files.data.byteLength)}, metadata ${bytes(new TextEncoder().encode(files.metaText).length)}`],
    ['Level', `${r.level.mode}, scale ×${r.level.scaleLinear.toPrecision(6)} (${dB(20 * Math.log10(r.level.scaleLinear))} dB)`],
    ['RMS level', `${dB(r.rmsDbfs)} dBFS`, 'Mean power of the written samples; 0 dBFS = complex magnitude 1.'],
    ['Peak level', `${dB(r.peakDbfs)} dBFS`, 'Largest |x|² of the written samples.'],
    ['Peak |I| or |Q|', `${dB(r.peakComponentDbfs)} dBFS`, 'Largest single component; above 0 dBFS clips integer formats and ±1.0 instruments.'],
    ['Crest factor', `${dB(r.crestFactorDb)} dB`, 'Peak over RMS of the written samples.'],
    [
      'Clipping',
      q === undefined ? 'none (floating point)' : q.clippedSamples === 0 ? `none (full scale code ${q.fullScaleCode})` : `${q.clippedSamples.toLocaleString('en')} samples (${q.clippedPercent.toPrecision(3)} %)`,
    ],
  ];
  if (q !== undefined) rows.push(['Quantisation SNR', `${dB(q.quantisationSnrDb, 1)} dB`]);
  return (
    <div className="export-report" aria-label="Export preview">
      <dl className="summary-list">
        {rows.map(([term, value, title]) => (
          <div key={term} {...(title !== undefined ? { title } : {})}>
            <dt>{term}</dt>
            <dd className={term === 'Clipping' && q !== undefined && q.clippedSamples > 0 ? 'value-bad' : undefined} data-report={term}>
              {value}
            </dd>
          </div>
        ))}
        <div>
          <dt>SHA-512</dt>
          <dd className="checksum" data-report="sha512">
            {files.sha512Hex}
          </dd>
        </div>
      </dl>
      {r.ccdf.length > 0 && (
        <p className="muted">
          Power CCDF of the written samples (dB above RMS):{' '}
          {r.ccdf.map((p) => `${p.probability.toExponential(0)}: ${p.levelDb.toFixed(2)}${p.reliable ? '' : '*'}`).join(' · ')}
          {r.ccdf.some((p) => !p.reliable) && ' (* fewer than 10 samples beyond: near the record’s peak)'}
        </p>
      )}
      {r.warnings.length > 0 && (
        <ul className="warnings" aria-label="Export warnings">
          {r.warnings.map((w) => (
            <li key={w}>{w}</li>
          ))}
        </ul>
      )}
    </div>
  );
}
