/**
 * A small camera drawn in the text's colour, for "from a photo" links and markers. Drawn rather than an
 * emoji: a device without an emoji font shows a blank box instead, and a coloured emoji ignores the palette.
 */
export function CameraGlyph({ className = '' }: { className?: string }) {
  return (
    <svg
      aria-hidden="true"
      focusable="false"
      viewBox="0 0 24 24"
      width="1em"
      height="1em"
      fill="none"
      stroke="currentColor"
      strokeWidth="2"
      strokeLinejoin="round"
      className={`inline-block shrink-0 align-[-0.125em] ${className}`}
    >
      <path d="M4 7h3.5l1.5-2.5h6L16.5 7H20a1 1 0 0 1 1 1v10a1 1 0 0 1-1 1H4a1 1 0 0 1-1-1V8a1 1 0 0 1 1-1Z" />
      <circle cx="12" cy="13" r="3.5" />
    </svg>
  );
}
