import { useRef } from 'react';
import { ModalDialog } from '../../../components/ui/modal-dialog';

const key = (userId: number | string) => `fanlight.listen-caution.v1.${userId}`;

/** The caution was read by this user on this browser (a failing storage counts as not read). */
export function cautionRead(userId: number | string | null): boolean {
  if (userId === null) return false;
  try {
    return localStorage.getItem(key(userId)) === 'read';
  } catch {
    return false;
  }
}

export function rememberCautionRead(userId: number | string | null): void {
  if (userId === null) return;
  try {
    localStorage.setItem(key(userId), 'read');
  } catch {
    // private mode: asked again next time
  }
}

/** The first time a user plays sound: headphones, level, and whose rules apply. */
export function ListenCaution({ onAccept, onCancel }: { onAccept: () => void; onCancel: () => void }) {
  const acceptRef = useRef<HTMLButtonElement>(null);
  return (
    <ModalDialog title="Before you listen: protect your hearing" onClose={onCancel} initialFocus={acceptRef} className="max-w-lg border-accent/60">
      <ul className="mb-4 flex list-disc flex-col gap-1.5 pl-5 text-sm text-mist-300">
        <li>Turn your headphone or speaker volume down before the first play, then raise it slowly.</li>
        <li>
          Playback starts at a low gain and a limiter holds peaks below −1 dB of full scale, but how loud full scale sounds depends on your
          headphones and volume setting, which this page cannot know.
        </li>
        <li>Recordings of drives can hold sudden loud transients and high, piercing carrier tones that are hard to judge by ear.</li>
        <li>
          As a guide, keep listening within about 80 dB(A) for 40 hours a week (WHO–ITU H.870). Your site&apos;s hearing-protection rules and
          local regulations come first.
        </li>
      </ul>
      <div className="flex justify-end gap-2">
        <button type="button" className="rounded-md px-3 py-1.5 text-sm text-mist-300 hover:bg-ink-800" onClick={onCancel}>
          Cancel
        </button>
        <button ref={acceptRef} type="button" className="rounded-md bg-accent px-3 py-1.5 text-sm font-medium text-ink-950 hover:bg-accent-strong" onClick={onAccept}>
          I understand, play
        </button>
      </div>
    </ModalDialog>
  );
}
