import type { Metadata } from 'next';
import Link from 'next/link';
import { AuthCard } from '@/components/auth/auth-card';
import { SignUpForm } from '@/components/auth/sign-up-form';

export const metadata: Metadata = { title: 'Sign up your company' };

export default function SignUpPage() {
  return (
    <AuthCard
      title="Sign up your company"
      intro="For installer companies. You become the company's owner and can invite your team later."
      footer={<>Already on NookPass? <Link href="/sign-in" className="underline">Sign in</Link>. Inspectors and administrators join by invitation.</>}
    >
      <SignUpForm />
    </AuthCard>
  );
}
