import { sewDayCautions } from '@shared/schemas/sewdays';

/** The usual workroom reminders, in our words; the maker's judgement and the host's rules come first. */
export function SewDayCautions() {
  return (
    <section aria-labelledby="sew-day-cautions" className="rounded-card border-l-4 border-weld bg-weld/10 px-5 py-4">
      <h2 id="sew-day-cautions" className="text-xl font-semibold text-walnut">
        Take care at the sew day
      </h2>
      <ul className="mt-2 list-disc space-y-1 pl-5">
        {sewDayCautions.map((c) => (
          <li key={c.topic}>
            <span className="font-semibold">{c.topic}:</span> {c.text}
          </li>
        ))}
      </ul>
      <p className="mt-2 text-base text-walnut-soft">
        These are reminders, not rules: you know your own tools and body best, and the host venue’s safety rules come first.
      </p>
    </section>
  );
}
