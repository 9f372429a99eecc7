import { useAppStore } from '../state/AppStoreContext';
import { fieldMessage, unplacedIssues, type ConfigDraft } from '../state/configValidation';
import { AllocationEditor } from './AllocationEditor';
import { configFieldKeys, configSections, type ConfigField, type ConfigSection } from './configFields';
import { FieldControl } from './FieldControl';

/** The field's message: issues at its path or below, plus those exactly at the paths it also shows. */
function messageFor(fieldErrors: Readonly<Record<string, string>>, field: ConfigField): string | undefined {
  const parts = [fieldMessage(fieldErrors, field.path), ...(field.alsoShows ?? []).map((path) => fieldErrors[path])].filter(
    (message): message is string => message !== undefined,
  );
  return parts.length > 0 ? parts.join('; ') : undefined;
}

function sectionHasIssue(section: ConfigSection, draft: ConfigDraft, fieldErrors: Readonly<Record<string, string>>): boolean {
  if (section.editor === 'allocation' && fieldMessage(fieldErrors, 'allocation') !== undefined) return true;
  return section.fields.some((field) => (field.visible?.(draft) ?? true) && messageFor(fieldErrors, field) !== undefined);
}

/** An optional section opens by itself when the draft uses it. */
function sectionActive(section: ConfigSection, draft: ConfigDraft): boolean {
  return section.fields.some((field) => field.kind === 'toggle' && draft[field.path] !== undefined);
}

/** The configuration form, in sections; every change is checked by the schema before it reaches the engine. */
export function ConfigPanel() {
  const draft = useAppStore((state) => state.draft);
  const fieldErrors = useAppStore((state) => state.fieldErrors);
  const setField = useAppStore((state) => state.setField);
  const others = unplacedIssues(fieldErrors, configFieldKeys);

  return (
    <section className="panel config-panel" aria-labelledby="config-heading">
      <h2 id="config-heading">Configuration</h2>
      <form onSubmit={(event) => event.preventDefault()} noValidate>
        {configSections.map((section) => (
          <details key={section.id} className="config-section" open={section.startClosed !== true || sectionActive(section, draft)} data-section={section.id}>
            <summary>
              {section.title}
              {sectionHasIssue(section, draft, fieldErrors) && (
                <span className="section-issue" aria-label="has a problem">
                  !
                </span>
              )}
            </summary>
            <div className="section-body">
              {section.fields
                .filter((field) => field.visible?.(draft) ?? true)
                .map((field) => (
                  <FieldControl
                    key={`${field.path}:${field.kind}`}
                    field={field}
                    draft={draft}
                    error={messageFor(fieldErrors, field)}
                    onChange={setField}
                  />
                ))}
              {section.editor === 'allocation' && <AllocationEditor />}
            </div>
          </details>
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
