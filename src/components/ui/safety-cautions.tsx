/** The usual workroom cautions, in our words; the maker's judgement and local rules come first. */
const cautions = {
  cutting: [
    'Close or cover the rotary cutter blade every time you put the cutter down.',
    'Cut away from your body, standing if that gives you a steadier stroke.',
    'Keep the fingers of the hand on the ruler back from its cutting edge; a cut-resistant glove helps.',
    'Wrap used blades before they go in the bin, and keep cutters out of children’s reach.',
  ],
  pressing: [
    'Stand the iron on its heel between presses and unplug it when you step away.',
    'Keep the cord out of walkways and away from the edge where it can be pulled.',
    'Steam burns too: keep your hand clear of the soleplate and the steam vents.',
  ],
  sewing: [
    'Keep pins in a cushion, never between your lips.',
    'Keep fingers clear of the needle, and switch the machine off to thread it or change the needle.',
  ],
} as const;

export type CautionTopic = keyof typeof cautions;

export function SafetyCautions({ topics, className = '' }: { topics: CautionTopic[]; className?: string }) {
  return (
    <aside aria-label="Safety cautions" className={`rounded-card border-2 border-weld bg-weld/10 p-4 ${className}`}>
      <p className="font-semibold text-weld-deep">⚠ Take care</p>
      <ul className="mt-2 list-disc space-y-1 pl-5">
        {topics
          .flatMap((t) => cautions[t])
          .map((line) => (
            <li key={line}>{line}</li>
          ))}
      </ul>
      <p className="mt-2 text-base text-walnut-soft">
        These are reminders, not rules: your own judgement and your venue’s rules come first.
      </p>
    </aside>
  );
}
