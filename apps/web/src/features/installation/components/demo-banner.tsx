import { useInstallation } from '../api/installation';

/** On every page of a demo installation: its data is invented and its passwords are published. */
export function DemoBanner() {
  const installation = useInstallation();
  if (!installation.data?.demo) return null;
  return (
    <p
      role="note"
      aria-label="Demo installation"
      className="border-b border-amber-300 bg-amber-100 px-6 py-1.5 text-center text-xs text-amber-950"
    >
      <span className="font-semibold">Demo installation.</span> The engines, limits, people and
      organisations are invented, and every demo account’s password is published. Never use it for a
      real engine.
    </p>
  );
}
