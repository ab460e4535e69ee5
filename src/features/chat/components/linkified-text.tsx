import { find } from 'linkifyjs';

/**
 * Plain text with its web addresses made into links. Everything is rendered as React text, never as
 * HTML, so markup in a message shows as typed; only http(s) links are made, and they open apart from
 * this page (noopener) without vouching for the target (nofollow).
 */
export function LinkifiedText({ text }: { text: string }) {
  const parts: (string | { href: string; label: string; at: number })[] = [];
  let cursor = 0;
  for (const link of find(text, 'url')) {
    if (!/^https?:\/\//i.test(link.href)) continue;
    if (link.start > cursor) parts.push(text.slice(cursor, link.start));
    parts.push({ href: link.href, label: link.value, at: link.start });
    cursor = link.end;
  }
  if (cursor < text.length) parts.push(text.slice(cursor));
  return (
    <span className="whitespace-pre-wrap break-words">
      {parts.map((p, i) =>
        typeof p === 'string' ? (
          p
        ) : (
          <a
            key={`${p.at}-${i}`}
            href={p.href}
            target="_blank"
            rel="noopener noreferrer nofollow ugc"
            className="text-indigo underline"
          >
            {p.label}
          </a>
        ),
      )}
    </span>
  );
}
