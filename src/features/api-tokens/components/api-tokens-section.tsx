import { useRef, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { ModalDialog } from '../../../components/ui/modal-dialog';
import { Notice } from '../../../components/ui/notice';
import { Section } from '../../../components/ui/section';
import { tableHeadRowClass } from '../../../components/ui/styles';
import { formatDateTime } from '../../../lib/format';
import { tokenState, useApiTokens, useRevokeApiToken, type ApiTokenRow } from '../api/api-tokens';
import { CreateTokenForm } from './create-token-form';

const when = (iso: string | null, none: string) =>
  iso ? (
    <time dateTime={iso} className="font-mono">
      {formatDateTime(iso)}
    </time>
  ) : (
    <span className="text-mist-500">{none}</span>
  );

/**
 * The user's personal API tokens: what scripts and the campaign command sign in with instead of a
 * session. Each opens one project with a role up to the user's, expires, and can be revoked (the row stays).
 */
export function ApiTokensSection() {
  const { data: tokens, isPending, error } = useApiTokens();
  const revoke = useRevokeApiToken();
  const [confirming, setConfirming] = useState<ApiTokenRow | null>(null);
  const cancelRef = useRef<HTMLButtonElement>(null);

  return (
    <Section title="API tokens">
      <div className="flex flex-col gap-4 text-sm">
        <p className="text-xs text-mist-500">
          A token lets a script, such as the campaign command on a test-rig PC, register results with one project as you, without your password.
        </p>
        {isPending && <p className="text-mist-500">Loading your tokens…</p>}
        {error && <Notice tone="error">{error.message}</Notice>}
        {revoke.error && <Notice tone="error">{revoke.error.message}</Notice>}
        {tokens && tokens.length === 0 && <p className="text-mist-500">You have no tokens.</p>}
        {tokens && tokens.length > 0 && (
          <div className="overflow-x-auto">
            <table className="w-full text-left" data-testid="api-tokens">
              <thead>
                <tr className={tableHeadRowClass}>
                  <th className="py-1.5 pr-3">Name</th>
                  <th className="py-1.5 pr-3">Project</th>
                  <th className="py-1.5 pr-3">Role</th>
                  <th className="py-1.5 pr-3">Expires</th>
                  <th className="py-1.5 pr-3">Last used</th>
                  <th className="py-1.5 pr-3">State</th>
                  <th className="py-1.5" />
                </tr>
              </thead>
              <tbody>
                {tokens.map((t) => {
                  const state = tokenState(t);
                  return (
                    <tr key={t.id} className="border-t border-ink-800 align-top text-xs" data-testid="api-token">
                      <td className="py-1.5 pr-3 text-sm text-mist-100">{t.name}</td>
                      <td className="py-1.5 pr-3">{t.projectName}</td>
                      <td className="py-1.5 pr-3">{t.role}</td>
                      <td className="py-1.5 pr-3">{when(t.expiresAt, '')}</td>
                      <td className="py-1.5 pr-3">{when(t.lastUsedAt, 'never')}</td>
                      <td className="py-1.5 pr-3">
                        {state === 'revoked' ? (
                          <span className="text-danger">revoked {t.revokedAt && formatDateTime(t.revokedAt)}</span>
                        ) : state === 'expired' ? (
                          <span className="text-mist-500">expired</span>
                        ) : (
                          <span className="text-ok">active</span>
                        )}
                      </td>
                      <td className="py-1.5 text-right">
                        {state === 'live' && (
                          <button
                            type="button"
                            className="rounded px-2 py-1 text-xs text-mist-500 hover:bg-ink-800 hover:text-danger"
                            aria-label={`Revoke the token ${t.name}`}
                            onClick={() => setConfirming(t)}
                          >
                            Revoke
                          </button>
                        )}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
        )}
        <div className="border-t border-ink-800 pt-4">
          <CreateTokenForm />
        </div>
      </div>
      {confirming && (
        <ModalDialog title={`Revoke the token “${confirming.name}”?`} onClose={() => setConfirming(null)} initialFocus={cancelRef}>
          <p className="mb-4 text-sm text-mist-300">
            Scripts using it are refused from now on (for {confirming.projectName}). This cannot be undone; make a new token if one is needed again.
          </p>
          <div className="flex justify-end gap-2">
            <button ref={cancelRef} type="button" className="rounded-md bg-ink-800 px-3.5 py-2 text-sm font-medium text-mist-100 hover:bg-ink-700" onClick={() => setConfirming(null)}>
              Keep it
            </button>
            <Button
              type="button"
              variant="danger"
              disabled={revoke.isPending}
              onClick={() => revoke.mutate(confirming.id, { onSuccess: () => setConfirming(null) })}
            >
              Revoke token
            </Button>
          </div>
        </ModalDialog>
      )}
    </Section>
  );
}
