import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { TextField } from '../../../components/ui/text-field';
import { signIn } from '../api/sign-in';

export const signInSchema = z.object({
  email: z.string().trim().min(1, 'Enter your e-mail address.').pipe(z.email('Enter an e-mail address such as name@example.org.')),
  password: z.string().min(1, 'Enter your password.'),
});
export type SignInValues = z.infer<typeof signInSchema>;

/** E-mail and password sign-in. Calls `onSignedIn` once the session cookie is set. */
export function SignInForm({ onSignedIn }: { onSignedIn: () => Promise<void> | void }) {
  const [serverError, setServerError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<SignInValues>({ resolver: zodResolver(signInSchema), defaultValues: { email: '', password: '' } });

  const onSubmit = handleSubmit(async (values) => {
    setServerError(null);
    const result = await signIn(values.email, values.password);
    if (!result.ok) {
      setServerError(result.message);
      return;
    }
    await onSignedIn();
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-labelledby="sign-in-heading" className="flex flex-col gap-5">
      {serverError && (
        <Notice tone="danger" label="Not signed in" role="alert">
          {serverError}
        </Notice>
      )}
      <TextField label="E-mail address" type="email" autoComplete="username" error={errors.email?.message} {...register('email')} />
      <TextField label="Password" type="password" autoComplete="current-password" error={errors.password?.message} {...register('password')} />
      <Button type="submit" disabled={isSubmitting} className="self-start">
        {isSubmitting ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
