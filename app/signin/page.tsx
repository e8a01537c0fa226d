import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { getCurrentUser } from '@/lib/auth';
import { safeCallbackUrl } from '@/lib/safe-redirect';
import { SignInForm } from '@/components/sign-in-form';
import { Logo } from '@/components/ui/logo';

export const metadata: Metadata = { title: 'Sign in' };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ callbackUrl?: string }> }) {
  const { callbackUrl } = await searchParams;
  // Only same-origin paths: never bounce a user to another origin after sign-in.
  const next = safeCallbackUrl(callbackUrl);
  if (await getCurrentUser()) redirect(next);
  const demo = process.env.PHASEWRIGHT_DEMO === '1';
  return (
    <main className="flex min-h-screen items-center justify-center bg-frame-dark px-4">
      <div className="w-full max-w-sm">
        <div className="mb-6 flex justify-center text-white">
          <Logo large />
        </div>
        <div className="card p-6">
          <h1 className="mb-4 text-lg font-semibold">Sign in</h1>
          <SignInForm callbackUrl={next} />
        </div>
        {demo && (
          <p className="mt-4 text-center text-xs text-slate-300">
            Demo accounts: admin@demo.test, designer@demo.test, reviewer@demo.test, viewer@demo.test — password{' '}
            <code className="font-mono">phasewright-demo</code>
          </p>
        )}
      </div>
    </main>
  );
}
