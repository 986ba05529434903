import Link from 'next/link';
import type { ReactNode } from 'react';
import { AccountMenu } from '@/components/shell/account-menu';
import { TeamSwitcher } from '@/components/shell/team-switcher';
import { PaletteProvider } from '@/components/palette/palette';
import { PaletteButton, ThemeToggle } from '@/components/palette/theme-toggle';
import { BrandMark } from '@/components/ui/brand';
import { requirePageUser } from '@/lib/auth/page';
import { earlyPaletteScript } from '@/components/palette/early-keys';
import { headers } from 'next/headers';

export default async function WorkspaceLayout({ children }: { children: ReactNode }) {
  const { user, teams } = await requirePageUser();
  const nonce = (await headers()).get('x-nonce') ?? undefined;
  return (
    <PaletteProvider>
    {/* Catches Ctrl+K (and what follows) before the page's scripts have run: see early-keys.ts. */}
    <script nonce={nonce} dangerouslySetInnerHTML={{ __html: earlyPaletteScript }} />
    <div className="min-h-screen">
      <header className="sticky top-0 z-20 border-b border-rule bg-paper/95 backdrop-blur">
        <div className="mx-auto flex h-12 max-w-[1400px] items-center gap-2 px-3 sm:gap-4 sm:px-4">
          <Link href="/sheets" aria-label="Denudata: sheets" className="flex items-center gap-2 font-semibold tracking-tight">
            <BrandMark />
            <span className="hidden sm:inline">Denudata</span>
          </Link>
          <nav aria-label="Main" className="flex items-center gap-3 text-[13px]">
            <Link href="/sheets" className="text-slate hover:text-basalt">
              Sheets
            </Link>
            <Link href="/datasets" className="text-slate hover:text-basalt">
              Datasets
            </Link>
            <Link href="/team" className="text-slate hover:text-basalt">
              Team
            </Link>
          </nav>
          <div className="ml-auto flex items-center gap-2 sm:gap-3">
            <PaletteButton />
            <ThemeToggle />
            <TeamSwitcher teams={teams} />
            <AccountMenu name={user.name} email={user.email} />
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto max-w-[1400px] px-3 py-5 sm:px-4">
        {children}
      </main>
    </div>
    </PaletteProvider>
  );
}
