import { useMemo, useState } from 'react';
import { useMutation, useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import type { DynoDto } from '@shared/schemas/run';
import { Button, ConfirmDialog, DataTable, EmptyState, ErrorState, Icon, PageHeader, useToast } from '@/components/ui';
import { useCurrentUser } from '@/lib/auth';
import { DYNO_KIND_LABELS, dynoQueries } from '../api/dyno-queries';
import { useDeleteDyno } from '../api/delete-dyno';
import { DynoFormDialog } from '../components/dyno-form-dialog';
import { DeviceTokensDialog } from '../components/device-tokens-dialog';
import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { usePageTitle } from '@/lib/page-title';

const col = createColumnHelper<DynoDto>();

/** Settings → Dynos: the shop's equipment, managed by the owner. */
export function DynosPage() {
  usePageTitle('Dynos');
  const user = useCurrentUser();
  const toast = useToast();
  const dynos = useQuery(dynoQueries.list());
  const [editing, setEditing] = useState<DynoDto | null>(null);
  const [formOpen, setFormOpen] = useState(false);
  const [deleting, setDeleting] = useState<DynoDto | null>(null);
  const [tokensOf, setTokensOf] = useState<DynoDto | null>(null);
  const remove = useDeleteDyno();
  const confirmDelete = useMutation({
    mutationFn: async (d: DynoDto) => {
      await remove.mutateAsync(d.id);
      return d;
    },
    onSuccess: (d) => {
      toast.success(`Removed ${d.name}`);
      setDeleting(null);
    },
    onError: (e) => toast.error('The dyno was not removed', { description: e.message }),
  });
  const isOwner = user.role === 'owner';

  const columns = useMemo(
    () => [
      col.accessor('name', { header: 'Name', cell: (c) => <span className="font-medium">{c.getValue()}</span> }),
      col.accessor('kind', { header: 'Kind', cell: (c) => DYNO_KIND_LABELS[c.getValue()] }),
      col.accessor('notes', { header: 'Notes', meta: { wrap: true }, cell: (c) => c.getValue() ?? <span className="text-ink-subtle">—</span> }),
      ...(isOwner
        ? [
            col.display({
              id: 'actions',
              header: () => <span className="sr-only">Actions</span>,
              meta: { align: 'right' },
              cell: (c) => (
                <div className="flex justify-end gap-2">
                  <Link to={paths.bayBoard(c.row.original.id)} className="focus-ring inline-flex min-h-10 items-center rounded-control px-3 text-accent underline">
                    Bay board
                  </Link>
                  <Button size="sm" onClick={() => setTokensOf(c.row.original)} aria-label={`Device tokens of ${c.row.original.name}`}>
                    Device tokens
                  </Button>
                  <Button
                    size="sm"
                    onClick={() => {
                      setEditing(c.row.original);
                      setFormOpen(true);
                    }}
                    aria-label={`Edit ${c.row.original.name}`}
                  >
                    Edit
                  </Button>
                  <Button size="sm" variant="ghost" onClick={() => setDeleting(c.row.original)} aria-label={`Remove ${c.row.original.name}`}>
                    Remove
                  </Button>
                </div>
              ),
            }),
          ]
        : []),
    ],
    [isOwner],
  );

  return (
    <div className="mx-auto max-w-5xl">
      <PageHeader
        title="Dynos"
        subtitle="The dynamometers this shop pulls on. Each session records one, so runs compare like with like."
        action={
          isOwner && (
            <Button
              variant="primary"
              icon={<Icon name="plus" size={18} />}
              onClick={() => {
                setEditing(null);
                setFormOpen(true);
              }}
            >
              Add dyno
            </Button>
          )
        }
      />
      {!isOwner && <p className="mb-4 text-ink-muted">Only the owner can add, edit or remove dynos.</p>}
      {dynos.isError ? (
        <ErrorState error={dynos.error} onRetry={() => dynos.refetch()} isRetrying={dynos.isFetching} />
      ) : (
        <DataTable
          caption="Dynos"
          columns={columns}
          data={dynos.data ?? []}
          isLoading={dynos.isLoading}
          maxHeight={null}
          getRowId={(d) => d.id}
          emptyMessage={<EmptyState title="No dynos yet" message="Add the shop's dyno so sessions can say where each run was made." />}
        />
      )}
      <DynoFormDialog open={formOpen} dyno={editing} onClose={() => setFormOpen(false)} />
      <DeviceTokensDialog dyno={tokensOf} onClose={() => setTokensOf(null)} />
      <ConfirmDialog
        open={deleting !== null}
        title={`Remove ${deleting?.name ?? 'this dyno'}?`}
        confirmLabel="Remove dyno"
        tone="danger"
        isConfirming={confirmDelete.isPending}
        onConfirm={() => deleting && confirmDelete.mutate(deleting)}
        onCancel={() => setDeleting(null)}
      >
        Sessions already recorded on it keep its name. New sessions can no longer choose it.
      </ConfirmDialog>
    </div>
  );
}
