import { useAppStore } from '../state/AppStoreContext';
import type { ThemePreference } from '../state/viewSlice';

const choices: { value: ThemePreference; label: string }[] = [
  { value: 'auto', label: 'System' },
  { value: 'light', label: 'Light' },
  { value: 'dark', label: 'Dark' },
];

/** Light / dark / follow the system, as a labelled select. */
export function ThemeChoice() {
  const preference = useAppStore((state) => state.themePreference);
  const setPreference = useAppStore((state) => state.setThemePreference);
  return (
    <label className="theme-choice">
      Theme
      <select value={preference} onChange={(event) => setPreference(event.target.value as ThemePreference)}>
        {choices.map((choice) => (
          <option key={choice.value} value={choice.value}>
            {choice.label}
          </option>
        ))}
      </select>
    </label>
  );
}
