import { useState, type FormEvent } from 'react';
import { Button, Dialog, FormError, TextAreaField, TextField, useToast } from '@/components/ui';
import { ApiError } from '@/lib/api-client';
import { useSendReport } from '../api/report-mutations';
import type { ReportDetail } from '../api/types';

function prefilledMessage(r: ReportDetail) {
  const first = r.customer.name.split(/\s+/)[0] || r.customer.name;
  return `Hello ${first},\n\nHere is the gain report for your ${r.bikeLabel}. The PDF is attached, and the link in this message shows the figures and chart online.\n\nThank you,\n${r.data.shop.name}`;
}

/** "Send to customer": recipient prefilled with the customer's e-mail, editable message. */
export function SendReportDialog({ report, open, onClose }: { report: ReportDetail; open: boolean; onClose: () => void }) {
  const [to, setTo] = useState(report.customer.email ?? '');
  const [message, setMessage] = useState(() => prefilledMessage(report));
  const send = useSendReport(report.id);
  const toast = useToast();
  const fieldError = (path: string) => (send.error instanceof ApiError ? send.error.fields.find((f) => f.path === path)?.message : undefined);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    send.mutate(
      { to, message },
      {
        onSuccess: () => {
          toast.success(`Report sent to ${to}`);
          onClose();
        },
      },
    );
  };

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
      <form id="send-report-form" onSubmit={submit} className="space-y-4" noValidate>
        {send.error && !(send.error instanceof ApiError && send.error.fields.length) ? <FormError error={send.error} /> : null}
        <TextField label="To" type="email" autoComplete="email" required value={to} onChange={(e) => setTo(e.target.value)} error={fieldError('to')} hint={report.customer.email ? undefined : 'This customer has no e-mail address on file.'} />
        <TextAreaField label="Message" rows={9} required value={message} onChange={(e) => setMessage(e.target.value)} error={fieldError('message')} />
      </form>
    </Dialog>
  );
}
