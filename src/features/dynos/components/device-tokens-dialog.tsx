import { useState, type FormEvent } from 'react';
import { useQuery } from '@tanstack/react-query';
import type { DynoDto } from '@shared/schemas/run';
import { formatDateTime } from '@shared/format';
import { Badge, Button, Caution, Dialog, ErrorState, FormError, LoadingState, TextField, useToast } from '@/components/ui';
import { bayQueries } from '../api/bay-queries';
import { useCreateDeviceToken, useRevokeDeviceToken } from '../api/device-tokens';

/**
 * A dyno's device tokens (owner only): make one for the dyno PC's sync agent — shown once, with a
 * copy button and the command to run — see when each was last used, and revoke one.
 */
export function DeviceTokensDialog({ dyno, onClose }: { dyno: DynoDto | null; onClose: () => void }) {
  const open = dyno !== null;
  const dynoId = dyno?.id ?? '';
  const toast = useToast();
  const tokens = useQuery({ ...bayQueries.tokens(dynoId), enabled: open });
  const create = useCreateDeviceToken(dynoId);
  const revoke = useRevokeDeviceToken(dynoId);
  const [name, setName] = useState('');
  const [shown, setShown] = useState<{ id: string; token: string } | null>(null);
  const [copied, setCopied] = useState(false);

  const close = () => {
    setShown(null);
    setName('');
    setCopied(false);
    create.reset();
    onClose();
  };
  const submit = (e: FormEvent) => {
    e.preventDefault();
    create.mutate(name.trim(), {
      onSuccess: (created) => {
        setShown(created);
        setName('');
        setCopied(false);
      },
    });
  };
  const copy = async () => {
    if (!shown) return;
    try {
      await navigator.clipboard.writeText(shown.token);
      setCopied(true);
    } catch {
      toast.error('Could not copy; select the token and copy it by hand');
    }
  };
  const command = shown ? `npm run sync -- --server ${window.location.origin} --token ${shown.token} "C:\\Dyno\\Runs"` : '';

  return (
    <Dialog open={open} onClose={close} title={`Device tokens · ${dyno?.name ?? ''}`} description="The dyno PC’s sync agent uses a token to send run files for this dyno, and nothing else." size="lg">
      {shown ? (
        <div className="mb-6 space-y-3 rounded-card border border-accent p-4" data-testid="new-device-token">
          <p className="font-semibold">Copy the token now: it is shown only once.</p>
          <div className="flex flex-wrap items-center gap-2">
            <code className="num break-all rounded-control bg-paper-sunk px-3 py-2 text-base" aria-label="New device token">
              {shown.token}
            </code>
            <Button size="sm" variant="primary" onClick={() => void copy()}>
              {copied ? 'Copied' : 'Copy token'}
            </Button>
          </div>
          <p className="text-ink-muted">On the dyno PC, in the Pullbook folder, run (with the folder the dyno saves its files in):</p>
          <code className="block break-all rounded-control bg-paper-sunk px-3 py-2 text-sm">{command}</code>
        </div>
      ) : (
        <form onSubmit={submit} className="mb-6 flex flex-wrap items-end gap-3">
          <div className="min-w-64 flex-1">
            <TextField label="Name" hint="Which PC uses it, e.g. “Bay 1 PC”" value={name} onChange={(e) => setName(e.target.value)} maxLength={100} required />
          </div>
          <Button type="submit" variant="primary" loading={create.isPending} loadingText="Creating…" disabled={!name.trim()}>
            Create token
          </Button>
          {create.isError && <FormError className="w-full" error={create.error} title="No token was made" />}
        </form>
      )}

      {tokens.isPending ? (
        <LoadingState message="Loading tokens…" />
      ) : tokens.isError ? (
        <ErrorState error={tokens.error} onRetry={() => tokens.refetch()} isRetrying={tokens.isFetching} />
      ) : tokens.data.length === 0 ? (
        <p className="text-ink-muted">No tokens yet: files from this dyno’s PC cannot reach Pullbook until one is made.</p>
      ) : (
        <ul className="divide-y divide-line" aria-label="Device tokens">
          {tokens.data.map((t) => (
            <li key={t.id} className="flex flex-wrap items-center gap-3 py-3">
              <div className="min-w-0 flex-1">
                <p className="font-medium">
                  {t.name} {t.revokedAt && <Badge tone="neutral">Revoked</Badge>}
                </p>
                <p className="text-sm text-ink-muted">
                  Made {formatDateTime(t.createdAt)}
                  {t.createdByName ? ` by ${t.createdByName}` : ''} · {t.lastUsedAt ? `last used ${formatDateTime(t.lastUsedAt)}` : 'never used'}
                  {t.revokedAt ? ` · revoked ${formatDateTime(t.revokedAt)}` : ''}
                </p>
              </div>
              {!t.revokedAt && (
                <Button size="sm" variant="ghost" loading={revoke.isPending && revoke.variables === t.id} onClick={() => revoke.mutate(t.id, { onSuccess: () => toast.success(`Revoked ${t.name}`) })} aria-label={`Revoke ${t.name}`}>
                  Revoke
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
      <Caution kind="notice" title="Keep tokens private" className="mt-4">
        A token lets whoever holds it send run files for this dyno. Revoke it when a PC is replaced or the token may have been seen.
      </Caution>
    </Dialog>
  );
}
