/**
 * The explanation lines of one band. A big model gives a line per settled or
 * frozen variable (dozens); the first few of each topic are shown, the rest
 * behind a "more" disclosure per topic that draws its lines only when
 * opened (a long list relaid out at every band would slow the slider).
 */
import { memo, useState } from 'react';
import type { ExplanationLine } from '../../core/view/explain';

/** Lines of one topic shown before the rest fold away. */
export const SHOWN_PER_TOPIC = 8;

const TOPIC_WORDS: Record<string, string> = { settled: 'settle', frozen: 'are held constant', block: 'blocks', dynamic: 'dynamic' };

function More({ lines, topic }: { lines: ExplanationLine[]; topic: string }) {
  const [open, setOpen] = useState(false);
  return (
    <li className="lf-explain-more" data-topic={`${topic}-more`}>
      <details open={open} onToggle={(e) => setOpen((e.currentTarget as HTMLDetailsElement).open)}>
        <summary>{lines.length} more {topic in TOPIC_WORDS ? `(${TOPIC_WORDS[topic]})` : ''}</summary>
        {open && <ul>{lines.map((l, i) => <li key={i} data-topic={l.topic}>{l.text}</li>)}</ul>}
      </details>
    </li>
  );
}

/** Memoised: re-drawn only when the band's lines change. */
export const ExplainList = memo(function ExplainList({ lines }: { lines: readonly ExplanationLine[] }) {
  const seen = new Map<string, number>();
  const rest = new Map<string, ExplanationLine[]>();
  const items: ({ line: ExplanationLine } | { more: string })[] = [];
  for (const l of lines) {
    const n = seen.get(l.topic) ?? 0;
    seen.set(l.topic, n + 1);
    if (n < SHOWN_PER_TOPIC) items.push({ line: l });
    else {
      if (!rest.has(l.topic)) { rest.set(l.topic, []); items.push({ more: l.topic }); }
      rest.get(l.topic)!.push(l);
    }
  }
  return (
    <ul>
      {items.map((it, i) => ('line' in it
        ? <li key={i} data-topic={it.line.topic}>{it.line.text}</li>
        : <More key={`more-${it.more}`} topic={it.more} lines={rest.get(it.more)!} />))}
    </ul>
  );
});
