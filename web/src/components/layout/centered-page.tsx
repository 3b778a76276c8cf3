import type { ReactNode } from 'react';
import { Logo } from '../ui/logo';

/** A page of its own outside the shell (signed out, waiting for access): brand and one card. */
export function CenteredPage({ children }: { children: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col items-center bg-gradient-to-br from-tide-900 to-tide-950 px-4 py-12">
      <div className="mb-6 flex items-center gap-2.5 text-white">
        <Logo className="h-10 w-10" />
        <span className="text-2xl font-bold tracking-tight">Ebbline</span>
      </div>
      <main className="w-full max-w-md rounded-2xl border-t-4 border-spark-400 bg-white p-6 shadow-2xl sm:p-8">
        {children}
      </main>
    </div>
  );
}
