import { useState, type Ref } from 'react';
import { TextField } from '@/components/ui/fields';
import { Button } from '@/components/ui/button';

interface Props {
  ref?: Ref<HTMLInputElement>;
  error: string | null;
  busy: boolean;
  /** true when a block was opened; the field is then cleared for the next label */
  onCode: (text: string) => Promise<boolean>;
  onTyping: () => void;
}

/**
 * The short code under the QR code, typed (any case, hyphen optional) — or a whole reference from a
 * barcode scanner that types like a keyboard. Enter takes the block in.
 */
export function CodeEntry({ ref, error, busy, onCode, onTyping }: Props) {
  const [text, setText] = useState('');
  return (
    <form
      noValidate
      className="flex flex-wrap items-end gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        void onCode(text).then((opened) => opened && setText(''));
      }}
    >
      <TextField
        ref={ref}
        label="Short code from the label"
        hint="Eight characters like K7QM-3XWD, or scan the QR code."
        autoFocus
        autoComplete="off"
        autoCapitalize="characters"
        spellCheck={false}
        enterKeyHint="go"
        className="font-mono text-2xl tracking-widest uppercase"
        wrapperClassName="min-w-0 flex-1 basis-64"
        value={text}
        error={error ?? undefined}
        onChange={(e) => {
          setText(e.target.value);
          onTyping();
        }}
      />
      <Button type="submit" pending={busy} pendingLabel="Finding…">
        Take in
      </Button>
    </form>
  );
}
