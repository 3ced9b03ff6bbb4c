import type { ReactNode } from 'react';
import { CautionLine } from '../../../components/layout/caution-line';

/** The frame of the signed-out pages. */
export function AuthCard({ title, children }: { title: string; children: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col bg-soot-900">
      <main className="flex flex-1 items-center justify-center px-4 py-12">
        <div className="w-full max-w-md">
          <div className="mb-6 flex items-center gap-3 text-white">
            <img src="/emberline.svg" alt="" className="size-10" />
            <div>
              <p className="text-2xl font-semibold tracking-tight">Emberline</p>
              <p className="text-sm text-soot-300">
                Hot-section borescope inspection and dispositions
              </p>
            </div>
          </div>
          <div className="rounded-lg bg-white p-6 shadow-xl">
            <h1 className="mb-4 text-xl font-semibold text-soot-900">{title}</h1>
            {children}
          </div>
        </div>
      </main>
      <CautionLine />
    </div>
  );
}
