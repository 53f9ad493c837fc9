import { useRef, useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { loginBodySchema, type LoginBody, type MeResponse } from '#shared/schemas/accounts';
import { Button } from '#src/components/ui/button';
import { FormAlert } from '#src/components/ui/form-alert';
import { TextField } from '#src/components/ui/text-field';
import { paths } from '#src/config/paths';
import { applyServerError } from '#src/lib/form-errors';
import { useLogin } from '../api/login';
import { PasswordField } from './password-field';

export interface SignInFormProps {
  onSignedIn: (me: MeResponse) => void;
}

type Field = keyof LoginBody;
const FIELDS: readonly Field[] = ['email', 'password'];

/** The first message the shared schema gives each field, or none when the form is fine. */
function check(form: HTMLFormElement): { body?: LoginBody; errors: Partial<Record<Field, string>> } {
  const data = new FormData(form);
  const parsed = loginBodySchema.safeParse({ email: data.get('email'), password: data.get('password') });
  if (parsed.success) return { body: parsed.data, errors: {} };
  const errors: Partial<Record<Field, string>> = {};
  for (const issue of parsed.error.issues) {
    const field = issue.path[0] as Field;
    errors[field] ??= issue.message;
  }
  return { errors };
}

/**
 * Sign-in. The first page a new phone loads, so it is a plain form checked with the same schema the
 * server uses (loginBodySchema), without react-hook-form: the form library loads later, with the
 * first page that needs one, and the first visit stays in its transfer budget (npm run bench).
 * As with the other forms, messages show after the first try and follow each change after that.
 */
export function SignInForm({ onSignedIn }: SignInFormProps) {
  const login = useLogin();
  const formRef = useRef<HTMLFormElement>(null);
  const [formError, setFormError] = useState<string>();
  const [errors, setErrors] = useState<Partial<Record<Field, string>>>({});
  const [tried, setTried] = useState(false);

  const focus = (field: Field) =>
    formRef.current?.querySelector<HTMLInputElement>(`[name="${field}"]`)?.focus();

  const onSubmit = async (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    setTried(true);
    setFormError(undefined);
    const { body, errors: found } = check(event.currentTarget);
    setErrors(found);
    if (!body) {
      const first = FIELDS.find((f) => found[f]);
      if (first) focus(first);
      return;
    }
    try {
      onSignedIn(await login.mutateAsync(body));
    } catch (error) {
      const fromServer: Partial<Record<Field, string>> = {};
      setFormError(
        applyServerError<LoginBody>(
          error,
          (field, { message }, options) => {
            fromServer[field as Field] = message;
            if (options?.shouldFocus) focus(field as Field);
          },
          FIELDS,
        ),
      );
      setErrors(fromServer);
    }
  };

  const onChange = () => {
    if (tried && formRef.current) setErrors(check(formRef.current).errors);
  };

  return (
    <form ref={formRef} noValidate onSubmit={onSubmit} onChange={onChange} className="grid gap-4">
      <FormAlert>{formError}</FormAlert>
      <TextField
        label="E-mail"
        name="email"
        type="email"
        autoComplete="email"
        inputMode="email"
        autoCapitalize="none"
        spellCheck={false}
        defaultValue=""
        error={errors.email}
      />
      <div>
        <PasswordField
          label="Password"
          name="password"
          autoComplete="current-password"
          defaultValue=""
          error={errors.password}
        />
        <Link
          to={paths.forgotPassword.getHref()}
          className="inline-flex min-h-11 items-center font-semibold text-moss-800 underline"
        >
          Forgot your password?
        </Link>
      </div>
      <Button type="submit" size="lg" fullWidth isLoading={login.isPending}>
        {login.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
