import { authClient } from '../../../lib/auth-client';

export type SignInResult = { ok: true } | { ok: false; message: string };

/** What better-auth answers on a failed sign-in, put in words for people. */
function messageFor(status: number, code: string | undefined): string {
  if (status === 401 || code === 'INVALID_EMAIL_OR_PASSWORD') {
    return 'That e-mail address and password do not match an account. Check both and try again.';
  }
  if (status === 403 && code === 'EMAIL_NOT_VERIFIED') return 'This account’s e-mail address is not confirmed yet. Ask your administrator.';
  if (status === 403) return 'This account may not sign in. Ask your administrator.';
  if (status === 429) return 'Too many attempts. Wait a minute, then try again.';
  if (status === 0) return 'The server could not be reached. Check the connection and try again.';
  return 'Signing in failed on the server. Try again in a moment; if it keeps failing, tell your administrator.';
}

export async function signIn(email: string, password: string): Promise<SignInResult> {
  try {
    const { error } = await authClient.signIn.email({ email, password });
    if (error) return { ok: false, message: messageFor(error.status, error.code) };
    return { ok: true };
  } catch {
    return { ok: false, message: messageFor(0, undefined) };
  }
}

export async function signOut(): Promise<void> {
  await authClient.signOut();
}
