import { useId, useState } from 'react';
import type { NotificationSettings } from '../../../server/schemas/views';
import { Notice } from '../../components/ui/notice';
import { Section } from '../../components/ui/section';
import { ApiTokensSection } from '../../features/api-tokens/components/api-tokens-section';
import { useMe } from '../../features/auth/api/auth';
import { useNotificationSettings, useUpdateNotifications } from '../../features/views/api/notifications';

const choices: { key: keyof NotificationSettings; label: string; hint: string }[] = [
  { key: 'replies', label: 'Mail me replies on my marks and views', hint: 'A comment in the thread of a mark or view you made.' },
  { key: 'mentions', label: 'Mail me when someone mentions me', hint: 'Someone writes @ and your first name or the first part of your e-mail.' },
  { key: 'shares', label: 'Mail me views shared with me', hint: 'A member sends you a view by e-mail.' },
];

export function SettingsPage() {
  const { data: me } = useMe();
  const { data: settings, isPending, error } = useNotificationSettings();
  const update = useUpdateNotifications();
  const [saved, setSaved] = useState<string | null>(null);
  const idBase = useId();

  // the box shows the choice at once; the answer confirms it (or an error puts it back)
  const shown = settings && update.isPending && update.variables ? { ...settings, ...update.variables } : settings;
  const change = (key: keyof NotificationSettings, on: boolean) => {
    setSaved(null);
    update.mutate({ [key]: on }, { onSuccess: () => setSaved('Saved.') });
  };

  return (
    <div className="mx-auto max-w-3xl px-6 py-8">
      <h1 className="mb-1 text-xl font-semibold">Settings</h1>
      {me && <p className="mb-6 text-sm text-mist-500">Signed in as {me.email}</p>}
      <Section title="Notifications">
        <div className="flex flex-col gap-4">
          {isPending && <p className="text-sm text-mist-500">Loading your settings…</p>}
          {error && <Notice tone="error">{error.message}</Notice>}
          {shown && (
            <fieldset className="flex flex-col gap-3" disabled={update.isPending}>
              <legend className="sr-only">Mail from Fanlight</legend>
              {choices.map(({ key, label, hint }) => (
                <div key={key} className="flex items-start gap-3">
                  <input
                    id={`${idBase}-${key}`}
                    type="checkbox"
                    className="mt-1 accent-accent"
                    checked={shown[key]}
                    onChange={(e) => change(key, e.target.checked)}
                    aria-describedby={`${idBase}-${key}-hint`}
                  />
                  <div>
                    <label htmlFor={`${idBase}-${key}`} className="text-sm text-mist-100">
                      {label}
                    </label>
                    <p id={`${idBase}-${key}-hint`} className="text-xs text-mist-500">
                      {hint}
                    </p>
                  </div>
                </div>
              ))}
            </fieldset>
          )}
          <div className="min-h-9">
            {update.error && <Notice tone="error">{update.error.message}</Notice>}
            {saved && !update.isPending && !update.error && <Notice tone="ok">{saved}</Notice>}
          </div>
        </div>
      </Section>
      <div className="mt-6">
        <ApiTokensSection />
      </div>
    </div>
  );
}
