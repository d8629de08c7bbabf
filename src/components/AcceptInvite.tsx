import { useState, type FormEvent } from 'react';
import FormField from './FormField.tsx';
import { api, ApiError } from '../lib/client/api.ts';
import { passwordSchema } from '../schemas/auth.ts';

/** Sets a password from an invitation link, once; then sends the person to sign in. */
export default function AcceptInvite({ token, name }: { token: string; name: string }) {
  const [password, setPassword] = useState('');
  const [repeat, setRepeat] = useState('');
  const [fields, setFields] = useState<Record<string, string>>({});
  const [done, setDone] = useState(false);
  const [busy, setBusy] = useState(false);

  async function submit(event: FormEvent) {
    event.preventDefault();
    const check = passwordSchema.safeParse(password);
    if (!check.success) return setFields({ password: check.error.issues[0]!.message });
    if (password !== repeat) return setFields({ repeat: 'The two passwords differ' });
    setBusy(true);
    try {
      await api('/api/invites/accept', { method: 'POST', body: { token, password } });
      setDone(true);
    } catch (e) {
      setFields(e instanceof ApiError ? { ...e.fields, _: e.message } : { _: 'Could not set the password' });
    } finally {
      setBusy(false);
    }
  }
  if (done) return <p role="status" className="text-sm">Your password is set. <a className="font-semibold text-ember-700 underline" href="/sign-in">Sign in</a></p>;
  return (
    <form onSubmit={submit} className="space-y-4" noValidate>
      <p className="text-sm">Welcome, {name}. Choose a password of at least 10 characters.</p>
      {fields._ && <p role="alert" className="text-sm text-ember-800">{fields._}</p>}
      <FormField id="password" label="Password" error={fields.password}>
        <input id="password" type="password" autoComplete="new-password" className="field" value={password} onChange={(e) => setPassword(e.target.value)} />
      </FormField>
      <FormField id="repeat" label="Password again" error={fields.repeat}>
        <input id="repeat" type="password" autoComplete="new-password" className="field" value={repeat} onChange={(e) => setRepeat(e.target.value)} />
      </FormField>
      <button className="btn-primary w-full" disabled={busy} type="submit">Set password</button>
    </form>
  );
}
