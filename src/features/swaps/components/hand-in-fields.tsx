import { SelectField, TextField } from '@/components/ui/fields';

export type HandInHow = 'in-person' | 'post';

/** How a block is handed in, and its note (a tracking number when it goes by post). */
export function HandInFields({
  how,
  note,
  onHowChange,
  onNoteChange,
}: {
  how: HandInHow;
  note: string;
  onHowChange: (how: HandInHow) => void;
  onNoteChange: (note: string) => void;
}) {
  return (
    <>
      <SelectField
        label="How"
        value={how}
        onChange={(e) => onHowChange(e.target.value as HandInHow)}
        options={[
          { value: 'in-person', label: 'In person, at a meeting' },
          { value: 'post', label: 'By post' },
        ]}
      />
      <TextField
        label={how === 'post' ? 'Tracking number or note' : 'Note'}
        hint="Optional"
        value={note}
        onChange={(e) => onNoteChange(e.target.value)}
        maxLength={500}
      />
    </>
  );
}
