import type { ReactNode } from 'react';

export function PageHeader({
  title,
  description,
  actions,
}: {
  title: string;
  description?: ReactNode;
  actions?: ReactNode;
}) {
  return (
    <div className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b border-soot-200 pb-4">
      <div>
        <h1 className="text-2xl font-semibold tracking-tight text-soot-900">{title}</h1>
        {description ? <p className="mt-1 max-w-3xl text-sm text-soot-600">{description}</p> : null}
      </div>
      {actions ? <div className="flex gap-2">{actions}</div> : null}
    </div>
  );
}

export function Panel({ children, className = '' }: { children: ReactNode; className?: string }) {
  return (
    <section className={`rounded-lg border border-soot-200 bg-white p-5 shadow-sm ${className}`}>
      {children}
    </section>
  );
}

export function LoadingLine({ label = 'Loading…' }: { label?: string }) {
  return (
    <p role="status" className="text-sm text-soot-600">
      {label}
    </p>
  );
}
