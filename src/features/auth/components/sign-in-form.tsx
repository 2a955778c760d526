import { useState, type FormEvent } from 'react';
import { ApiError } from '../../../lib/api-error';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { LoginInputSchema, useLogin } from '../api/login';

function loginErrorText(error: unknown): string {
  if (error instanceof ApiError) {
    if (error.code === 'invalid_credentials' || error.status === 401) return 'Wrong e-mail or password.';
    if (error.code === 'rate_limited' || error.status === 429)
      return error.message || 'Too many sign-in attempts. Wait a while, then try again.';
    return error.message;
  }
  return 'Sign-in failed. Try again.';
}

export function SignInForm({ onSignedIn }: { onSignedIn: () => void }) {
  const login = useLogin();
  const [fieldErrors, setFieldErrors] = useState<{ email?: string; password?: string }>({});

  function submit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    const parsed = LoginInputSchema.safeParse({ email: String(form.get('email') ?? '').trim(), password: String(form.get('password') ?? '') });
    if (!parsed.success) {
      const errs: typeof fieldErrors = {};
      for (const issue of parsed.error.issues) {
        const k = issue.path[0] as 'email' | 'password';
        errs[k] ??= issue.message;
      }
      setFieldErrors(errs);
      return;
    }
    setFieldErrors({});
    login.mutate(parsed.data, { onSuccess: onSignedIn });
  }

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      <TextField label="E-mail" name="email" type="email" autoComplete="username" required autoFocus error={fieldErrors.email} />
      <TextField label="Password" name="password" type="password" autoComplete="current-password" required error={fieldErrors.password} />
      {login.isError && (
        <p role="alert" className="rounded-md border border-danger/50 bg-danger/10 px-3 py-2 font-medium text-danger">
          {loginErrorText(login.error)}
        </p>
      )}
      <Button type="submit" variant="primary" disabled={login.isPending} className="mt-2">
        {login.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
