import { cautions } from '@emberline/contracts/cautions';

export function CautionLine() {
  return (
    <footer className="border-t border-soot-200 bg-soot-100 px-6 py-3 text-xs text-soot-700">
      <p className="mx-auto max-w-7xl">
        <span className="font-semibold text-soot-900">Caution. </span>
        {cautions.short}
      </p>
    </footer>
  );
}
