import { useId } from 'react';
import { readAtPath } from '../form/draftPath';
import type { ConfigDraft } from '../state/configValidation';
import { parseListInput, parseNumberInput, type ConfigField } from './configFields';

export interface FieldControlProps {
  field: ConfigField;
  draft: ConfigDraft;
  error: string | undefined;
  onChange(path: string, value: unknown): void;
}

/** One labelled form control; its error (the schema's or the engine's message) sits right under it. */
export function FieldControl({ field, draft, error, onChange }: FieldControlProps) {
  const id = useId();
  const errorId = `${id}-error`;
  const hintId = `${id}-hint`;
  const hint = typeof field.hint === 'function' ? field.hint(draft) : field.hint;
  const describedBy = [error !== undefined ? errorId : '', hint !== undefined ? hintId : ''].filter(Boolean).join(' ');
  const raw = readAtPath(draft, field.path);
  const common = {
    id,
    name: field.path,
    'aria-invalid': error !== undefined,
    ...(describedBy !== '' ? { 'aria-describedby': describedBy } : {}),
  };

  let control;
  if (field.kind === 'select') {
    const options = field.options(draft);
    const current = raw ?? field.defaultValue(draft);
    // A value the list does not hold (e.g. loaded from a file) stays visible, so its error makes sense.
    const known = options.some((option) => option.value === current);
    control = (
      <select
        {...common}
        value={String(current)}
        onChange={(event) => {
          const chosen = options.find((option) => String(option.value) === event.target.value);
          onChange(field.path, chosen?.value ?? event.target.value);
        }}
      >
        {!known && <option value={String(current)}>{String(current)}</option>}
        {options.map((option) => (
          <option key={String(option.value)} value={String(option.value)}>
            {option.label}
          </option>
        ))}
      </select>
    );
  } else if (field.kind === 'toggle') {
    const checked = raw !== undefined && (raw as { enabled?: unknown } | null)?.enabled !== false;
    return (
      <div className={`field field-toggle${error !== undefined ? ' field-invalid' : ''}`} data-field={field.path}>
        <label className="checkbox" htmlFor={id}>
          <input
            {...common}
            type="checkbox"
            checked={checked}
            onChange={(event) => onChange(field.path, event.target.checked ? field.onValue(draft) : undefined)}
          />
          {field.label}
        </label>
        {hint !== undefined && (
          <p id={hintId} className="field-hint">
            {hint}
          </p>
        )}
        {error !== undefined && (
          <p id={errorId} className="field-error" role="alert">
            {error}
          </p>
        )}
      </div>
    );
  } else if (field.kind === 'list') {
    control = (
      <input
        {...common}
        type="text"
        value={Array.isArray(raw) ? raw.join(', ') : raw === undefined ? '' : String(raw)}
        {...(field.placeholder !== undefined ? { placeholder: field.placeholder } : {})}
        onChange={(event) => onChange(field.path, parseListInput(event.target.value))}
      />
    );
  } else if (field.kind === 'text') {
    control = (
      <textarea
        {...common}
        rows={2}
        spellCheck={false}
        value={typeof raw === 'string' ? raw : field.defaultValue}
        {...(field.placeholder !== undefined ? { placeholder: field.placeholder } : {})}
        onChange={(event) => onChange(field.path, event.target.value)}
      />
    );
  } else {
    const listId = field.suggestions !== undefined ? `${id}-suggestions` : undefined;
    const shown = raw === undefined ? (field.defaultValue === undefined ? '' : String(field.defaultValue)) : String(raw);
    control = (
      <span className="number-with-unit">
        <input
          {...common}
          type="number"
          inputMode="decimal"
          step={field.step ?? 'any'}
          value={shown}
          {...(field.placeholder !== undefined ? { placeholder: field.placeholder } : {})}
          {...(listId !== undefined ? { list: listId } : {})}
          onChange={(event) => {
            const parsed = parseNumberInput(event.target.value);
            onChange(field.path, parsed === '' && field.optional === true ? undefined : parsed);
          }}
        />
        {field.unit !== undefined && <span className="unit">{field.unit}</span>}
        {listId !== undefined && (
          <datalist id={listId}>
            {field.suggestions?.(draft).map((value) => (
              <option key={value} value={value} />
            ))}
          </datalist>
        )}
      </span>
    );
  }

  return (
    <div className={`field${error !== undefined ? ' field-invalid' : ''}`} data-field={field.path}>
      <label htmlFor={id}>{field.label}</label>
      {control}
      {hint !== undefined && (
        <p id={hintId} className="field-hint">
          {hint}
        </p>
      )}
      {error !== undefined && (
        <p id={errorId} className="field-error" role="alert">
          {error}
        </p>
      )}
    </div>
  );
}
