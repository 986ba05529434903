import type { Metadata } from 'next';
import { ResetRequestForm } from '@/components/auth/reset-request-form';

export const metadata: Metadata = { title: 'Set a new password' };

export default function ResetPasswordRequestPage() {
  return <ResetRequestForm />;
}
