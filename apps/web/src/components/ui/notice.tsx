import type { ReactNode } from 'react';

const tones = {
  error: 'border-red-300 bg-red-50 text-red-900',
  info: 'border-soot-300 bg-white text-soot-800',
  success: 'border-emerald-300 bg-emerald-50 text-emerald-900',
  caution: 'border-amber-300 bg-amber-50 text-amber-950',
} as const;

export function Notice({
  tone = 'info',
  children,
  title,
}: {
  tone?: keyof typeof tones;
  title?: string;
  children: ReactNode;
}) {
  return (
    <div
      role={tone === 'error' ? 'alert' : 'status'}
      className={`rounded-md border px-4 py-3 text-sm ${tones[tone]}`}
    >
      {title ? <p className="font-semibold">{title}</p> : null}
      <div>{children}</div>
    </div>
  );
}
