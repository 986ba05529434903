import type { ReactNode } from 'react';
import { BrandMark } from '@/components/ui/brand';

export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <main className="flex min-h-screen items-start justify-center px-4 pt-[12vh]">
      <div className="w-full max-w-sm">
        <div className="mb-6 flex items-center gap-2">
          <BrandMark size={28} />
          <span className="text-[18px] font-semibold tracking-tight">Denudata</span>
        </div>
        <div className="rounded-[4px] border border-rule bg-chalk p-6">{children}</div>
        <p className="mt-4 text-[12px] text-slate">
          Reproducible erosion and landscape-change calculations, kept as reviewed revisions.
        </p>
      </div>
    </main>
  );
}
