import { useEffect, useId, useMemo, useRef, useState, type ReactNode } from 'react';
import type { ExportFormat } from '../../io/exportFormats';
import { isSuperseded, type ExportedFiles } from '../../worker/client';
import { configFileName } from '../persist/configFile';
import { downloadFile } from '../download';
import { useAppStore } from '../state/AppStoreContext';
import { useEngineClient } from '../state/EngineContext';
import {
  checkExportForm,
  defaultLevelLabel,
  exportDownloads,
  FORMAT_LABELS,
  FORMAT_ORDER,
  initialExportForm,
  type ExportFormState,
  type LevelMode,
} from './exportForm';
import { ExportReportView } from './ExportReportView';

interface Row {
  field: keyof ExportFormState;
  label: string;
  unit?: string;
  control: (id: string, invalid: boolean, describedBy: string | undefined) => ReactNode;
}

const levelModes: { value: LevelMode; label: string }[] = [
  { value: 'default', label: 'Format default' },
  { value: 'formula', label: 'Formula scale (unscaled)' },
  { value: 'linear', label: 'Fixed linear scale' },
  { value: 'rms', label: 'RMS at a dBFS level' },
  { value: 'peak', label: 'Peak at a dBFS level' },
  { value: 'auto', label: 'Auto (from the power CCDF)' },
];

type Prepared = { key: string; files: ExportedFiles } | { key: string; error: string } | null;

/** Builds IQ files with src/io in the worker, shows level, peak, clipping and checksum, then saves them. */
export function ExportDialog({ open, onClose }: { open: boolean; onClose(): void }) {
  const client = useEngineClient();
  const submittedDraft = useAppStore((state) => state.submittedDraft);
  const draftValid = useAppStore((state) => Object.keys(state.fieldErrors).length === 0 && state.submittedDraft === state.draft);
  const scenarioName = useAppStore((state) => state.scenarioName);
  const dialogRef = useRef<HTMLDialogElement>(null);
  const [form, setForm] = useState<ExportFormState>(() => initialExportForm(configFileName(scenarioName).replace(/\.json$/, '')));
  const [prepared, setPrepared] = useState<Prepared>(null);
  const [busy, setBusy] = useState(false);
  const baseId = useId();
  const checked = useMemo(() => checkExportForm(form), [form]);
  const key = checked.ok ? JSON.stringify([submittedDraft, checked.options]) : null;

  const [nameTouched, setNameTouched] = useState(false);
  useEffect(() => {
    const dialog = dialogRef.current;
    if (dialog === null) return;
    if (open && !dialog.open) {
      // The file name follows the scenario until the user types one.
      if (!nameTouched) setForm((f) => ({ ...f, baseName: configFileName(scenarioName).replace(/\.json$/, '') }));
      dialog.showModal();
    }
    if (!open && dialog.open) dialog.close();
  }, [open, nameTouched, scenarioName]);

  // Build the files whenever the options or the configuration change (debounced; the newest wins).
  useEffect(() => {
    if (!open || key === null || !checked.ok || !draftValid || submittedDraft === null) return;
    if (prepared?.key === key) return;
    const timer = setTimeout(() => {
      setBusy(true);
      client.exportFile(submittedDraft, checked.options).then(
        (files) => {
          setPrepared({ key, files });
          setBusy(false);
        },
        (error: unknown) => {
          if (isSuperseded(error)) return;
          setPrepared({ key, error: error instanceof Error ? error.message : String(error) });
          setBusy(false);
        },
      );
    }, 250);
    return () => clearTimeout(timer);
  }, [open, key, checked, draftValid, submittedDraft, client, prepared?.key]);

  const set = (field: keyof ExportFormState, value: string) => {
    if (field === 'baseName') setNameTouched(true);
    setForm((f) => ({ ...f, [field]: value }));
  };
  const errors = checked.ok ? {} : checked.errors;
  const current = prepared !== null && prepared.key === key ? prepared : null;
  const files = current !== null && 'files' in current ? current.files : null;

  const text = (field: keyof ExportFormState, placeholder = '') => (id: string, invalid: boolean, describedBy: string | undefined) => (
    <input
      id={id}
      type="text"
      inputMode="decimal"
      value={form[field]}
      placeholder={placeholder}
      aria-invalid={invalid}
      {...(describedBy !== undefined ? { 'aria-describedby': describedBy } : {})}
      onChange={(event) => set(field, event.target.value)}
    />
  );

  const rows: Row[] = [
    { field: 'baseName', label: 'File name', control: text('baseName') },
    {
      field: 'format',
      label: 'Format',
      control: (id, invalid) => (
        <select id={id} value={form.format} aria-invalid={invalid} onChange={(event) => set('format', event.target.value as ExportFormat)}>
          {FORMAT_ORDER.map((format) => (
            <option key={format} value={format}>
              {FORMAT_LABELS[format]}
            </option>
          ))}
        </select>
      ),
    },
    {
      field: 'levelMode',
      label: 'Level',
      control: (id, invalid) => (
        <select id={id} value={form.levelMode} aria-invalid={invalid} onChange={(event) => set('levelMode', event.target.value)}>
          {levelModes.map((mode) => (
            <option key={mode.value} value={mode.value}>
              {mode.value === 'default' ? `${mode.label}: ${defaultLevelLabel(form.format)}` : mode.label}
            </option>
          ))}
        </select>
      ),
    },
  ];
  if (form.levelMode === 'rms' || form.levelMode === 'peak') rows.push({ field: 'levelDbfs', label: `${form.levelMode === 'rms' ? 'RMS' : 'Peak'} level`, unit: 'dBFS', control: text('levelDbfs') });
  if (form.levelMode === 'linear') rows.push({ field: 'scaleLinear', label: 'Scale factor', unit: '×', control: text('scaleLinear') });
  if (form.levelMode === 'auto') {
    rows.push({ field: 'autoMarginDb', label: 'Margin below full scale', unit: 'dB', control: text('autoMarginDb', '1') });
    rows.push({ field: 'autoProbability', label: 'At CCDF probability', control: text('autoProbability', '1e-4') });
  }
  rows.push(
    { field: 'sampleRateHz', label: 'Output sample rate', unit: 'Hz', control: text('sampleRateHz', 'waveform rate') },
    { field: 'freqOffsetHz', label: 'Frequency offset', unit: 'Hz', control: text('freqOffsetHz', '0') },
    { field: 'repeat', label: 'Copies of the record', control: text('repeat', '1') },
    { field: 'centerFrequencyHz', label: 'RF centre (metadata)', unit: 'Hz', control: text('centerFrequencyHz', 'from the carrier frequency') },
    { field: 'description', label: 'Description', control: text('description', 'generated from the configuration') },
    { field: 'author', label: 'Author', control: text('author') },
  );

  const save = () => {
    if (files === null || !checked.ok) return;
    for (const file of exportDownloads(form.format, checked.baseName, files, Math.floor(Date.now() / 1000))) {
      downloadFile(file.content as BlobPart, file.name, file.mimeType);
    }
  };

  return (
    <dialog ref={dialogRef} className="export-dialog" aria-labelledby={`${baseId}-title`} onClose={onClose} onCancel={onClose}>
      <div className="dialog-head">
        <h2 id={`${baseId}-title`}>Export IQ file</h2>
        <button type="button" className="icon-button" aria-label="Close" onClick={onClose}>
          ×
        </button>
      </div>
      <div className="export-body">
        <form className="export-form" onSubmit={(event) => event.preventDefault()} noValidate>
          {rows.map((row) => {
            const id = `${baseId}-${row.field}`;
            const error = errors[row.field];
            const errorId = error !== undefined ? `${id}-error` : undefined;
            return (
              <div key={row.field} className={`field${error !== undefined ? ' field-invalid' : ''}`} data-export-field={row.field}>
                <label htmlFor={id}>{row.label}</label>
                <span className="number-with-unit">
                  {row.control(id, error !== undefined, errorId)}
                  {row.unit !== undefined && <span className="unit">{row.unit}</span>}
                </span>
                {error !== undefined && (
                  <p id={errorId} className="field-error" role="alert">
                    {error}
                  </p>
                )}
              </div>
            );
          })}
        </form>
        <div className="export-preview">
          {!draftValid && <p className="field-error">The configuration has problems (marked in the form); fix them before exporting.</p>}
          {busy && <p className="muted" role="status">Building the file with the engine…</p>}
          {current !== null && 'error' in current && (
            <p className="field-error" role="alert">
              {current.error}
            </p>
          )}
          {files !== null && <ExportReportView files={files} />}
          <p className="safety-notice" role="note" aria-label="Export safety caution">
            <strong>Before you play this file:</strong> transmit only under a licence for the frequency and power, and within local
            regulations. Test conducted — cable, attenuators or a shielded enclosure — and check the level and crest factor above against
            your instrument’s input limits (maximum power, DC and damage levels).
          </p>
        </div>
      </div>
      <div className="dialog-actions">
        <span className="muted">The same bytes as <code>crestline generate</code> with these options.</span>
        <button type="button" className="button" onClick={onClose}>
          Cancel
        </button>
        <button type="button" className="button button-primary" disabled={files === null || busy} onClick={save}>
          Save files
        </button>
      </div>
    </dialog>
  );
}
