import { layoutTrackDiagram, type DiagramBlockInput, type DiagramLinkInput, type PlacedBlock } from '@/lib/layouts/track-diagram';

/** A train drawn in a block: its name on a tag in its cab's colour. */
export type DiagramMark = { key: string; label: string; colour: string; standing: boolean };

type Props = {
  blocks: readonly DiagramBlockInput[];
  links: readonly DiagramLinkInput[];
  /** What the picture shows, for the accessible name: "Track diagram of …". */
  title: string;
  /** Blocks picked in order (numbered on the drawing). */
  picked?: readonly string[];
  /** Blocks of the route found through the picked ones (shaded). */
  route?: readonly string[];
  /** Trains to draw in blocks, by block id. */
  marks?: ReadonlyMap<string, readonly DiagramMark[]>;
  /** Makes each block a button that picks it. */
  onPick?: (blockId: string) => void;
  /** Prefix of the ids the drawing's title and description use (unique on the page). */
  idPrefix?: string;
};

/** Characters of a block's name that fit over its segment at 11 px. */
const NAME_CHARS = 19;
const TAG_CHARS = 12;
/** The least the drawing shrinks to fit its frame (see the svg style below). */
const MIN_SCALE = 0.9;

const short = (text: string, chars: number) => (text.length > chars ? `${text.slice(0, chars - 1)}…` : text);
/** Long names keep their start and their end ("Larkholm…road 3"): the end often tells blocks apart. */
const shortMiddle = (text: string, chars: number) => {
  if (text.length <= chars) return text;
  const head = Math.ceil((chars - 1) / 2);
  return `${text.slice(0, head).trimEnd()}…${text.slice(text.length - (chars - 1 - head)).trimStart()}`;
};

/**
 * The layout drawn as a schematic from its blocks and links (placed by `layoutTrackDiagram`):
 * each block a segment with its `a` and `b` ends, links as connectors between the ends they join,
 * reversing sections drawn as a hatched segment, places where trains may reverse with a diamond.
 * Fits its box down to 60 % of its natural size, then scrolls sideways. No state of its own, so it
 * renders on the server too; with `onPick` its blocks are buttons.
 */
export function TrackDiagram({ blocks, links, title, picked = [], route = [], marks, onPick, idPrefix = 'track-diagram' }: Props) {
  const d = layoutTrackDiagram(blocks, links);
  const onRoute = new Set(route);
  const reversingSections = d.blocks.filter((b) => b.reversingSection).map((b) => b.name);
  const loops = d.links.filter((l) => l.shape === 'loop').length;
  const summary = [
    `${d.blocks.length} block${d.blocks.length === 1 ? '' : 's'} and ${d.links.length} link${d.links.length === 1 ? '' : 's'}`,
    reversingSections.length ? `reversing section${reversingSections.length === 1 ? '' : 's'}: ${reversingSections.join(', ')}` : 'no reversing section',
    loops ? `${loops} link${loops === 1 ? '' : 's'} turning back on the line (a loop or wye)` : null,
  ]
    .filter(Boolean)
    .join('; ');
  if (d.blocks.length === 0) return <p className="text-sm text-muted">No blocks to draw yet.</p>;
  return (
    <figure className="space-y-2" data-testid="track-diagram">
      <div className="overflow-x-auto rounded-plate border border-line bg-paper" tabIndex={0} role="region" aria-label={`${title} (scrolls sideways)`}>
        <svg
          viewBox={`0 0 ${d.width} ${d.height}`}
          width={d.width}
          height={d.height}
          // Shrink at most to 90 %: block names (11 px) and train tags stay readable at about 10 px; a wider
          // layout scrolls sideways in its frame instead of shrinking into unreadable type.
          style={{ width: '100%', height: 'auto', maxWidth: d.width, minWidth: Math.round(d.width * MIN_SCALE) }}
          role={onPick ? 'group' : 'img'}
          aria-labelledby={`${idPrefix}-title ${idPrefix}-desc`}
          className="block select-none"
        >
          <title id={`${idPrefix}-title`}>{title}</title>
          <desc id={`${idPrefix}-desc`}>{summary}.</desc>
          <defs>
            <pattern id={`${idPrefix}-hatch`} width="8" height="8" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
              <rect width="8" height="8" className="fill-brass" />
              <rect width="3.5" height="8" className="fill-brass-soft" />
            </pattern>
          </defs>
          {d.links.map((l) => (
            <path
              key={`${l.from.blockId}:${l.from.end}-${l.to.blockId}:${l.to.end}`}
              d={l.d}
              fill="none"
              className={l.shape === 'loop' ? 'stroke-brass' : 'stroke-muted'}
              strokeWidth={3}
              strokeLinecap="round"
              data-testid="diagram-link"
              data-shape={l.shape}
            />
          ))}
          {d.blocks.map((b) => (
            <DiagramBlock
              key={b.id}
              block={b}
              order={picked.indexOf(b.id)}
              onRoute={onRoute.has(b.id)}
              marks={marks?.get(b.id) ?? []}
              onPick={onPick}
              hatch={`url(#${idPrefix}-hatch)`}
            />
          ))}
        </svg>
      </div>
      <figcaption className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-muted">
        <span className="flex items-center gap-1.5">
          <svg width="28" height="8" aria-hidden><line x1="2" y1="4" x2="26" y2="4" className="stroke-ink" strokeWidth={6} strokeLinecap="round" /></svg>
          block, ends a and b
        </span>
        <span className="flex items-center gap-1.5">
          <svg width="28" height="10" aria-hidden><rect x="1" y="1" width="26" height="8" rx="3" fill={`url(#${idPrefix}-hatch)`} /></svg>
          reversing section (own polarity switch)
        </span>
        <span className="flex items-center gap-1.5">
          <svg width="12" height="12" aria-hidden><path d="M6 1 L11 6 L6 11 L1 6 Z" className="fill-verdigris" /></svg>
          trains may reverse here
        </span>
        {loops ? (
          <span className="flex items-center gap-1.5">
            <svg width="28" height="10" aria-hidden><path d="M2 2 C 30 2, 30 9, 14 9" fill="none" className="stroke-brass" strokeWidth={2.5} /></svg>
            link turning back (loop or wye)
          </span>
        ) : null}
        {d.omittedBlocks ? <span>Only the first {d.blocks.length} blocks in position order are drawn; the table lists all.</span> : null}
      </figcaption>
    </figure>
  );
}

function DiagramBlock({
  block: b,
  order,
  onRoute,
  marks,
  onPick,
  hatch,
}: {
  block: PlacedBlock;
  hatch: string;
  order: number;
  onRoute: boolean;
  marks: readonly DiagramMark[];
  onPick?: ((id: string) => void) | undefined;
}) {
  const x1 = Math.min(b.ends.a.x, b.ends.b.x);
  const x2 = Math.max(b.ends.a.x, b.ends.b.x);
  const y = b.ends.a.y;
  const mid = (x1 + x2) / 2;
  const picked = order >= 0;
  const label = `${b.name}${b.reversingSection ? ', reversing section' : ''}${b.reversingPlace ? ', trains may reverse here' : ''}${
    marks.length ? `; ${marks.map((m) => `${m.label} ${m.standing ? 'standing' : 'running'}`).join(', ')}` : ''
  }`;
  const interactive = onPick
    ? {
        role: 'button',
        tabIndex: 0,
        'aria-label': `${picked ? `Picked ${order + 1}: ` : 'Pick '}${label}`,
        'aria-pressed': picked,
        onClick: () => onPick(b.id),
        onKeyDown: (e: React.KeyboardEvent) => {
          if (e.key === 'Enter' || e.key === ' ') {
            e.preventDefault();
            onPick(b.id);
          }
        },
        className: 'cursor-pointer outline-none [&:focus-visible_.focus-ring]:stroke-verdigris',
      }
    : {};
  return (
    <g data-testid="diagram-block" data-block-id={b.id} data-reversing-section={b.reversingSection || undefined} data-picked={picked || undefined} {...interactive}>
      <title>{label}</title>
      {/* A generous hit area for fingers and the focus ring. */}
      <rect x={x1 - 6} y={y - 26} width={x2 - x1 + 12} height={marks.length ? 36 + marks.length * 18 : 46} rx={6} fill="transparent" className="focus-ring" strokeWidth={2} />
      {onRoute || picked ? <line x1={x1} y1={y} x2={x2} y2={y} className="stroke-verdigris-soft" strokeWidth={16} strokeLinecap="round" /> : null}
      {b.reversingSection ? (
        <rect x={x1} y={y - 5} width={x2 - x1} height={10} rx={4} fill={hatch} />
      ) : (
        <line x1={x1} y1={y} x2={x2} y2={y} className={picked ? 'stroke-verdigris' : 'stroke-ink'} strokeWidth={6} strokeLinecap="round" />
      )}
      {/* Rail joints at the two ends. */}
      <circle cx={b.ends.a.x} cy={y} r={3.5} className="fill-paper stroke-ink" strokeWidth={1.5} />
      <circle cx={b.ends.b.x} cy={y} r={3.5} className="fill-paper stroke-ink" strokeWidth={1.5} />
      <text x={b.ends.a.x + (b.flipped ? -9 : 9)} y={y + 16} textAnchor="middle" className="fill-muted text-[10px]" aria-hidden>a</text>
      <text x={b.ends.b.x + (b.flipped ? 9 : -9)} y={y + 16} textAnchor="middle" className="fill-muted text-[10px]" aria-hidden>b</text>
      {b.reversingPlace ? <path d={`M${mid} ${y - 8} L${mid + 6} ${y} L${mid} ${y + 8} L${mid - 6} ${y} Z`} className="fill-verdigris stroke-paper" strokeWidth={1} /> : null}
      <text x={mid} y={y - 11} textAnchor="middle" className={`text-[11px] ${picked ? 'fill-verdigris-strong font-semibold' : 'fill-ink'}`} aria-hidden>
        {shortMiddle(b.name, NAME_CHARS)}
      </text>
      {picked ? (
        <g aria-hidden>
          <circle cx={x1} cy={y - 14} r={8} className="fill-verdigris" />
          <text x={x1} y={y - 10.5} textAnchor="middle" className="fill-paper text-[10px] font-bold">{order + 1}</text>
        </g>
      ) : null}
      {marks.map((m, i) => (
        <g key={m.key} data-testid="diagram-train" data-label={m.label} aria-hidden>
          <rect x={mid - 42} y={y + 8 + i * 18} width={84} height={16} rx={8} style={{ fill: m.colour }} strokeDasharray={m.standing ? '3 2' : undefined} className="stroke-paper" strokeWidth={1.5} />
          <text x={mid} y={y + 20 + i * 18} textAnchor="middle" className="text-[10px] font-semibold" style={{ fill: '#fff' }}>
            {short(m.label, TAG_CHARS)}
          </text>
        </g>
      ))}
    </g>
  );
}

