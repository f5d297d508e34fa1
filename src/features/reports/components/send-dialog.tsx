import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { sendInput } from '@shared/schemas/report';
import { FormDialog, TextAreaField, TextField, useToast } from '@/components/ui';
import { useFormSubmit } from '@/lib/use-form-submit';
import { useSendReport } from '../api/send-report';
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
export function SendReportDialog({ report, open, onClose, onSent }: { report: ReportDetail; open: boolean; onClose: () => void; onSent?: (shareUrl: string) => void }) {
  const send = useSendReport(report.id);
  const toast = useToast();
  const form = useForm<SendValues, unknown, z.output<typeof sendInput>>({
    resolver: zodResolver(sendInput),
    mode: 'onTouched',
    defaultValues: { to: report.customer.email ?? '', message: prefilledMessage(report) },
  });
  const { errors } = form.formState;

  const { onSubmit, alert } = useFormSubmit(form, async (values) => {
    const sent = await send.mutateAsync(values);
    onSent?.(sent.shareUrl);
    toast.success(sent.status === 'queued' ? `Report queued for ${values.to}: the mail server is not answering, Pullbook keeps trying` : `Report sent to ${values.to}`);
    onClose();
  });

  return (
    <FormDialog
      open={open}
      onClose={onClose}
      busy={send.isPending}
      title="Send the report to the customer"
      description={`Version ${report.version} of ${report.number} goes as a PDF attachment, with a share link valid for 30 days.`}
      size="lg"
      formId="send-report-form"
      onSubmit={onSubmit}
      submitLabel="Send report"
      busyLabel="Sending…"
      cancelVariant="ghost"
      formError={alert}
      formErrorTitle="The report was not sent"
    >
        <TextField label="To" type="email" autoComplete="email" required error={errors.to} hint={report.customer.email ? undefined : 'This customer has no e-mail address on file.'} {...form.register('to')} />
        <TextAreaField label="Message" rows={9} required error={errors.message} {...form.register('message')} />
    </FormDialog>
  );
}
