import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import QueryRoot from './QueryRoot.tsx';
import FormField from './FormField.tsx';
import { api } from '../lib/client/api.ts';
import { apiErrors, zodErrors } from '../lib/client/form-errors.ts';
import { inviteSchema } from '../schemas/auth.ts';

interface User { id: number; email: string; name: string; role: string; active: boolean; farrierId: number | null }
interface Invite { id: number; email: string; name: string; role: string; expiresAt: string; acceptedAt: string | null }
interface FarrierOption { id: number; name: string }

const ROLE = { lead: 'Lead', dispatcher: 'Dispatcher', farrier: 'Farrier' } as Record<string, string>;

function Team({ farriers, selfId }: { farriers: FarrierOption[]; selfId: number }) {
  const client = useQueryClient();
  const toggle = useMutation({
    mutationFn: (u: User) => api<{ user: User }>(`/api/users/${u.id}`, { method: 'PATCH', body: { active: !u.active } }),
    onSuccess: () => void client.invalidateQueries({ queryKey: ['users'] }),
  });
  const users = useQuery({ queryKey: ['users'], queryFn: () => api<{ users: User[] }>('/api/users') });
  const invites = useQuery({ queryKey: ['invites'], queryFn: () => api<{ invites: Invite[] }>('/api/invites') });
  const [form, setForm] = useState({ email: '', name: '', role: 'dispatcher', farrierId: '' });
  const [fields, setFields] = useState<Record<string, string>>({});
  const [notice, setNotice] = useState('');
  const send = useMutation({
    mutationFn: (body: unknown) => api<{ invite: Invite & { mailSent: boolean } }>('/api/invites', { method: 'POST', body }),
    onSuccess: (data) => {
      setNotice(data.invite.mailSent ? `Invitation e-mailed to ${data.invite.email}.` : `Invitation saved, but the e-mail could not be sent.`);
      setForm({ email: '', name: '', role: 'dispatcher', farrierId: '' });
      void client.invalidateQueries({ queryKey: ['invites'] });
    },
    onError: (error) => setFields(apiErrors(error)),
  });
  const fieldNames = (...keys: string[]) => keys.map((k) => fields[k]).find(Boolean);

  function submit(event: FormEvent) {
    event.preventDefault();
    setNotice('');
    const body = { email: form.email, name: form.name, role: form.role, farrierId: form.farrierId ? Number(form.farrierId) : null };
    const parsed = inviteSchema.safeParse(body);
    if (!parsed.success) {
      setFields(zodErrors(parsed.error));
      return;
    }
    setFields({});
    send.mutate(body);
  }

  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_20rem]">
      <section className="card overflow-hidden">
        <h2 className="px-4 pt-4">People</h2>
        {users.isPending && <p className="p-4 text-sm text-slateblue-500">Loading…</p>}
        {users.isError && <p role="alert" className="p-4 text-sm text-ember-800">Could not load the team: {users.error.message}</p>}
        {toggle.isError && <p role="alert" className="px-4 text-sm text-ember-800">{toggle.error.message}</p>}
        {users.data && (
          <table className="mt-2 w-full text-sm">
            <thead className="bg-slateblue-50 text-left text-xs uppercase tracking-wide text-slateblue-500">
              <tr><th className="px-4 py-2">Name</th><th className="px-4 py-2">E-mail</th><th className="px-4 py-2">Role</th><th className="px-4 py-2">State</th><th className="px-4 py-2"><span className="sr-only">Change</span></th></tr>
            </thead>
            <tbody>
              {users.data.users.map((u) => (
                <tr key={u.id} className="border-t border-slateblue-100">
                  <td className="px-4 py-2 font-medium">{u.name}</td>
                  <td className="px-4 py-2 font-mono text-xs">{u.email}</td>
                  <td className="px-4 py-2">{ROLE[u.role]}</td>
                  <td className="px-4 py-2">{u.active ? 'active' : 'deactivated'}</td>
                  <td className="px-4 py-2 text-right">
                    {u.id !== selfId && (
                      <button type="button" className="text-xs font-semibold text-ember-700 hover:underline disabled:opacity-50" disabled={toggle.isPending} onClick={() => toggle.mutate(u)}>
                        {u.active ? 'Deactivate' : 'Reactivate'}
                      </button>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        <h2 className="px-4 pt-6">Invitations</h2>
        {invites.data && invites.data.invites.length === 0 && <p className="px-4 pb-4 text-sm text-slateblue-500">No invitations sent yet.</p>}
        {invites.data && invites.data.invites.length > 0 && (
          <ul className="divide-y divide-slateblue-100 pb-2 text-sm">
            {invites.data.invites.map((i) => (
              <li key={i.id} className="flex justify-between px-4 py-2">
                <span>{i.name} · <span className="font-mono text-xs">{i.email}</span> · {ROLE[i.role]}</span>
                <span className="text-xs text-slateblue-500">{i.acceptedAt ? 'accepted' : new Date(i.expiresAt) < new Date() ? 'expired' : `open until ${new Date(i.expiresAt).toLocaleDateString()}`}</span>
              </li>
            ))}
          </ul>
        )}
      </section>
      <form onSubmit={submit} className="card space-y-3 self-start p-4" noValidate aria-label="Invite someone">
        <h2>Invite someone</h2>
        {fields._ && <p role="alert" className="text-sm text-ember-800">{fields._}</p>}
        {notice && <p role="status" className="text-sm text-slateblue-700">{notice}</p>}
        <FormField id="invite-name" label="Name" error={fields.name}>
          <input id="invite-name" className="field" value={form.name} onChange={(e) => setForm({ ...form, name: e.target.value })} />
        </FormField>
        <FormField id="invite-email" label="E-mail" error={fields.email}>
          <input id="invite-email" type="email" className="field" value={form.email} onChange={(e) => setForm({ ...form, email: e.target.value })} />
        </FormField>
        <FormField id="invite-role" label="Role" error={fields.role}>
          <select id="invite-role" className="field" value={form.role} onChange={(e) => setForm({ ...form, role: e.target.value })}>
            <option value="dispatcher">Dispatcher</option>
            <option value="farrier">Farrier</option>
            <option value="lead">Lead</option>
          </select>
        </FormField>
        {form.role === 'farrier' && (
          <FormField id="invite-farrier" label="Farrier" error={fieldNames('farrierId')}>
            <select id="invite-farrier" className="field" value={form.farrierId} onChange={(e) => setForm({ ...form, farrierId: e.target.value })}>
              <option value="">Choose…</option>
              {farriers.map((f) => <option key={f.id} value={f.id}>{f.name}</option>)}
            </select>
          </FormField>
        )}
        <button className="btn-primary w-full" type="submit" disabled={send.isPending}>{send.isPending ? 'Sending…' : 'Send invitation'}</button>
      </form>
    </div>
  );
}

export default function TeamPanel(props: { farriers: FarrierOption[]; selfId: number }) {
  return <QueryRoot><Team {...props} /></QueryRoot>;
}
