import { useRecordsKeyState } from '../api/installation';

/**
 * On every signed-in page while the records key is kept inside the data directory: the records
 * check cannot then tell a change made by whoever can write that directory (DESIGN §5.5).
 */
export function RecordsKeyBanner() {
  const state = useRecordsKeyState();
  if (!state.data?.insideDataDir) return null;
  return (
    <p
      role="note"
      aria-label="Records key"
      className="border-b border-amber-300 bg-amber-50 px-6 py-1.5 text-center text-xs text-amber-950"
    >
      <span className="font-semibold">Records key kept with the records.</span> Whoever can write
      the data directory could change signed records undetected; an administrator should set
      RECORDS_KEY_FILE to a key kept elsewhere.
    </p>
  );
}
