import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { sendInput } from '@shared/schemas/report';
import { Button, Dialog, FormError, TextAreaField, TextField, useToast, fieldProblemsSummary } from '@/components/ui';
import { applyFieldErrors } from '@/lib/api-client';
import { useSendReport } from '../api/report-mutations';
import type { ReportDetail } from '../api/types';

type SendValues = z.input<typeof sendInput>;

function prefilledMessage(r: ReportDetail) {
  const first = r.customer.name.split(/\s+/)[0] || r.customer.name;
  return `Hello ${first},\n\nHere is the gain report for your ${r.bikeLabel}. The PDF is attached, and the link in this message shows the figures and chart online.\n\nThank you,\n${r.data.shop.name}`;
}

/**
 * "Send to customer": recipient prefilled with the customer's e-mail, editable message. Validated
 * with the server's own schema (@shared/schemas/report) before sending; the server's field errors
 * land on the same fields.
 */
export function SendReportDialog({ report, open, onClose }: { report: ReportDetail; open: boolean; onClose: () => void }) {
  const send = useSendReport(report.id);
  const toast = useToast();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<SendValues, unknown, z.output<typeof sendInput>>({
    resolver: zodResolver(sendInput),
    mode: 'onTouched',
    defaultValues: { to: report.customer.email ?? '', message: prefilledMessage(report) },
  });
  const { errors, isSubmitted } = form.formState;
  const fieldProblems = fieldProblemsSummary(isSubmitted, errors);

  const onSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await send.mutateAsync(values);
      toast.success(`Report sent to ${values.to}`);
      onClose();
    } catch (err) {
      if (!applyFieldErrors(err, form.setError)) setFormError(err instanceof Error ? err.message : 'Try again in a moment.');
    }
  });

  return (
    <Dialog
      open={open}
      onClose={onClose}
      busy={send.isPending}
      title="Send the report to the customer"
      description={`Version ${report.version} of ${report.number} goes as a PDF attachment, with a share link valid for 30 days.`}
      size="lg"
      footer={
        <>
          <Button variant="ghost" onClick={onClose} disabled={send.isPending}>
            Cancel
          </Button>
          <Button variant="primary" type="submit" form="send-report-form" loading={send.isPending} loadingText="Sending…">
            Send report
          </Button>
        </>
      }
    >
      <form id="send-report-form" onSubmit={onSubmit} className="space-y-4" noValidate>
        <FormError error={formError ?? fieldProblems} title="The report was not sent" />
        <TextField label="To" type="email" autoComplete="email" required error={errors.to} hint={report.customer.email ? undefined : 'This customer has no e-mail address on file.'} {...form.register('to')} />
        <TextAreaField label="Message" rows={9} required error={errors.message} {...form.register('message')} />
      </form>
    </Dialog>
  );
}
