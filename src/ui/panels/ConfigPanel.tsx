import { useId } from 'react';
import { useAppStore } from '../state/AppStoreContext';
import { fieldMessage, unplacedIssues, type ConfigDraft } from '../state/configValidation';
import { configFieldKeys, configFields, parseNumberInput, type ConfigField } from './configFields';

interface FieldProps {
  field: ConfigField;
  draft: ConfigDraft;
  error: string | undefined;
  onChange(key: string, value: unknown): void;
}

function FieldControl({ field, draft, error, onChange }: FieldProps) {
  const id = useId();
  const errorId = `${id}-error`;
  const hintId = `${id}-hint`;
  const describedBy = [error !== undefined ? errorId : '', field.hint !== undefined ? hintId : ''].filter(Boolean).join(' ');
  const raw = draft[field.key];
  const common = {
    id,
    name: field.key,
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
          onChange(field.key, chosen?.value ?? event.target.value);
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
  } else {
    const listId = field.suggestions !== undefined ? `${id}-suggestions` : undefined;
    control = (
      <span className="number-with-unit">
        <input
          {...common}
          type="number"
          inputMode="decimal"
          step={field.step ?? 'any'}
          value={raw === undefined ? String(field.defaultValue) : String(raw)}
          {...(listId !== undefined ? { list: listId } : {})}
          onChange={(event) => onChange(field.key, parseNumberInput(event.target.value))}
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
    <div className={`field${error !== undefined ? ' field-invalid' : ''}`} data-field={field.key}>
      <label htmlFor={id}>{field.label}</label>
      {control}
      {field.hint !== undefined && (
        <p id={hintId} className="field-hint">
          {field.hint}
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

/** The compact configuration form: every change is checked by the schema before it reaches the engine. */
export function ConfigPanel() {
  const draft = useAppStore((state) => state.draft);
  const fieldErrors = useAppStore((state) => state.fieldErrors);
  const setField = useAppStore((state) => state.setField);
  const others = unplacedIssues(fieldErrors, configFieldKeys);
  const visibleFields = configFields.filter((field) => field.visible?.(draft) ?? true);

  return (
    <section className="panel config-panel" aria-labelledby="config-heading">
      <h2 id="config-heading">Configuration</h2>
      <form onSubmit={(event) => event.preventDefault()} noValidate>
        {visibleFields.map((field) => (
          <FieldControl
            key={field.key}
            field={field}
            draft={draft}
            error={fieldMessage(fieldErrors, field.key)}
            onChange={setField}
          />
        ))}
      </form>
      {others.length > 0 && (
        <ul className="form-issues" role="alert" aria-label="Other configuration problems">
          {others.map((message) => (
            <li key={message}>{message}</li>
          ))}
        </ul>
      )}
    </section>
  );
}
