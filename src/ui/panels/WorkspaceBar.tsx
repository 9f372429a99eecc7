import { useRef, useState } from 'react';
import { configFileName, formatConfigJson, parseConfigFile } from '../persist/configFile';
import { downloadFile } from '../download';
import { ExportDialog } from '../export/ExportDialog';
import { useAppStore } from '../state/AppStoreContext';

/** Header tools: the configuration as a CLI JSON file (save, open) and the permalink. */
export function WorkspaceBar() {
  const draft = useAppStore((state) => state.draft);
  const fieldErrors = useAppStore((state) => state.fieldErrors);
  const scenarioName = useAppStore((state) => state.scenarioName);
  const replaceDraft = useAppStore((state) => state.replaceDraft);
  const fileRef = useRef<HTMLInputElement>(null);
  const [message, setMessage] = useState<{ kind: 'info' | 'error'; text: string } | null>(null);
  const [exportOpen, setExportOpen] = useState(false);
  const valid = Object.keys(fieldErrors).length === 0;

  const copyLink = async () => {
    try {
      await navigator.clipboard.writeText(window.location.href);
      setMessage({ kind: 'info', text: 'Link copied: it opens this configuration.' });
    } catch {
      setMessage({ kind: 'info', text: 'Copy the address bar: the link opens this configuration.' });
    }
  };

  return (
    <div className="workspace-bar" role="toolbar" aria-label="Configuration file and link">
      <button
        type="button"
        className="button"
        disabled={!valid}
        title={valid ? 'The same JSON `crestline generate --config` reads' : 'Fix the marked fields first'}
        onClick={() => downloadFile(formatConfigJson(draft), configFileName(scenarioName), 'application/json')}
      >
        Save JSON
      </button>
      <button type="button" className="button" onClick={() => fileRef.current?.click()}>
        Open JSON…
      </button>
      <input
        ref={fileRef}
        type="file"
        accept="application/json,.json"
        className="visually-hidden"
        aria-label="Configuration file to open"
        tabIndex={-1}
        onChange={async (event) => {
          const file = event.target.files?.[0];
          event.target.value = '';
          if (file === undefined) return;
          const parsed = parseConfigFile(await file.text(), file.name);
          if (!parsed.ok) {
            setMessage({ kind: 'error', text: parsed.message });
            return;
          }
          replaceDraft(parsed.config, file.name.replace(/\.json$/i, ''), `Opened from ${file.name}.`);
          setMessage(
            parsed.issues.length > 0
              ? { kind: 'error', text: `${file.name} opened with ${parsed.issues.length} problem(s), marked in the form.` }
              : { kind: 'info', text: `${file.name} opened.` },
          );
        }}
      />
      <button type="button" className="button" onClick={() => void copyLink()}>
        Copy link
      </button>
      <button type="button" className="button button-primary" onClick={() => setExportOpen(true)}>
        Export IQ…
      </button>
      <ExportDialog open={exportOpen} onClose={() => setExportOpen(false)} />
      {message !== null && (
        <span className={message.kind === 'error' ? 'bar-message field-error' : 'bar-message'} role={message.kind === 'error' ? 'alert' : 'status'}>
          {message.text}
        </span>
      )}
    </div>
  );
}
