import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate } from 'react-router-dom';
import { Button, Card, FormError, TextAreaField, useToast } from '@/components/ui';
import { paths } from '@/config/paths';
import { hasRole, useAuth } from '@/lib/auth';
import { formatDate } from '@shared/format';
import { reportQueries } from '../api/report-queries';
import { useCreateReport } from '../api/create-report';

/** "Make gain report" for a saved comparison: optional technician's note, then the report page. */
export function ComparisonReportActions({ comparisonId }: { comparisonId: string }) {
  const { user } = useAuth();
  const existing = useQuery(reportQueries.list({ comparisonId }));
  const create = useCreateReport();
  const navigate = useNavigate();
  const toast = useToast();
  const [note, setNote] = useState('');
  if (!hasRole(user, ['owner', 'tuner', 'desk'])) return null;
  const latest = existing.data?.[0];

  return (
    <Card title="Gain report" description="A PDF for the customer with these figures, the chart, the build stages and costs, and the usual cautions.">
      <form
        className="space-y-3"
        onSubmit={(e) => {
          e.preventDefault();
          create.mutate(
            { comparisonId, technicianNote: note.trim() ? note.trim() : undefined },
            {
              onSuccess: (r) => {
                toast.success(`Report ${r.number} version ${r.version} is ready`);
                navigate(paths.report(r.id));
              },
            },
          );
        }}
      >
        <TextAreaField label="Technician's note (optional)" hint={latest ? 'Leave empty to keep the note of the previous version.' : 'Printed on the report, e.g. break-in advice or a follow-up check.'} rows={3} maxLength={3000} value={note} onChange={(e) => setNote(e.target.value)} />
        <FormError error={create.error} title="The report was not made" />
        <div className="flex flex-wrap items-center gap-3">
          <Button type="submit" variant="primary" loading={create.isPending} loadingText="Making the PDF…">
            {latest ? 'Make a new version' : 'Make gain report'}
          </Button>
          {latest ? (
            <Link to={paths.report(latest.id)} className="text-sm text-accent underline-offset-2 hover:underline">
              Latest: {latest.number} v{latest.version}, {formatDate(latest.createdAt)}
            </Link>
          ) : null}
        </div>
      </form>
    </Card>
  );
}
