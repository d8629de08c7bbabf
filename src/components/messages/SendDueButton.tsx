/** Sends the texts that are due now (client:load); quiet hours still hold texts back. */
import { useMutation } from '@tanstack/react-query';
import QueryRoot from '../QueryRoot';
import { api } from '../../lib/client/api';

interface SendResult { sent: number; deferred: number; suppressed: number; failed: number }

function Button() {
  const send = useMutation({
    mutationFn: () => api<SendResult>('/api/messages/send', { method: 'POST', body: {} }),
    onSuccess: () => setTimeout(() => window.location.reload(), 800),
  });
  return (
    <div className="flex items-center gap-3">
      <button type="button" className="btn-quiet" onClick={() => send.mutate()} disabled={send.isPending}>{send.isPending ? 'Sending…' : 'Send due texts now'}</button>
      {send.data && <span className="text-sm text-slateblue-600"><span className="figure">{send.data.sent}</span> sent · <span className="figure">{send.data.deferred}</span> held for quiet hours · <span className="figure">{send.data.suppressed}</span> dropped · <span className="figure">{send.data.failed}</span> failed</span>}
      {send.error && <span role="alert" className="field-error">{send.error.message}</span>}
    </div>
  );
}

export default function SendDueButton() {
  return (
    <QueryRoot>
      <Button />
    </QueryRoot>
  );
}
