import Box from '@mui/material/Box';
import Link from '@mui/material/Link';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import { type ComponentProps, createContext, type JSX, type ReactNode, useContext } from 'react';
import Markdown, { type Components, type ExtraProps } from 'react-markdown';
import remarkGfm from 'remark-gfm';

type HeadingTag = 'h2' | 'h3' | 'h4' | 'h5' | 'h6';
const HEADING_TAGS: readonly HeadingTag[] = ['h2', 'h3', 'h4', 'h5', 'h6'];

/** Text of a heading line as a reader sees it: no `#`s, emphasis marks or spacing differences. */
function plainHeading(text: string): string {
  return text
    .replace(/^\s{0,3}#{1,6}\s+/, '')
    .replace(/\s+#+\s*$/, '')
    .replace(/[*_`]/g, '')
    .replace(/\s+/g, ' ')
    .trim()
    .toLowerCase();
}

/**
 * The text without its first line when that line is a heading saying the same as `title`, which the page
 * already shows above it (the notices' files open with their title as a heading).
 */
export function withoutRepeatedTitle(text: string, title: string | undefined): string {
  if (!title) return text;
  const match = /^\s*(#{1,6}[ \t][^\n]*)(\n|$)/.exec(text);
  if (!match?.[1] || plainHeading(match[1]) !== plainHeading(title)) return text;
  return text.slice(match[0].length);
}

/** A heading of the text, placed below the page's own headings (`#` becomes `topLevel`). */
function heading(level: number, topLevel: number) {
  const tag = HEADING_TAGS[Math.min(Math.max(level + topLevel - 3, 0), HEADING_TAGS.length - 1)] ?? 'h6';
  return function MarkdownHeading({ children }: { children?: ReactNode }) {
    return (
      <Typography
        component={tag}
        variant="subtitle1"
        sx={{ fontWeight: 700, mt: 1.5, mb: 0.5, '&:first-of-type': { mt: 0 } }}
      >
        {children}
      </Typography>
    );
  };
}

type Props<T extends keyof JSX.IntrinsicElements> = ComponentProps<T> & ExtraProps;

/** The title of the text being rendered, for the names of its tables (the components are shared). */
const TitleContext = createContext<string | undefined>(undefined);

type HastElement = NonNullable<ExtraProps['node']>;

/** The text of a node of the rendered Markdown, as it reads. */
function nodeText(node: HastElement['children'][number]): string {
  if (node.type === 'text') return node.value;
  return node.type === 'element' ? node.children.map(nodeText).join('') : '';
}

/**
 * A table's accessible name, saying what it lists: the text's title and the table's column headings
 * ("Laser eye protection: machine, wavelength, where it harms the eye"). Its scrolling box is a region, which
 * needs a name (WAI-ARIA 1.2, region role), and several regions named just "Table" cannot be told apart.
 */
export function tableName(node: HastElement | undefined, title: string | undefined): string {
  const headings: string[] = [];
  const walk = (n: HastElement) => {
    if (n.tagName === 'th') headings.push(nodeText(n).trim());
    else for (const c of n.children) if (c.type === 'element') walk(c);
  };
  if (node) walk(node);
  const columns = headings.filter(Boolean).join(', ');
  if (!columns) return title ? `${title}: table` : 'Table';
  return title ? `${title}: ${columns}` : `Table of ${columns}`;
}

/** Cells wrap to fit; a table still too wide scrolls inside its own box, so a phone-width page never grows. */
function MarkdownTable({ children, node }: Props<'table'>) {
  const title = useContext(TitleContext);
  return (
    <Box
      sx={{
        overflowX: 'auto',
        my: 1,
        maxWidth: '100%',
        border: 1,
        borderColor: 'divider',
        borderRadius: 1,
      }}
      tabIndex={0}
      role="region"
      aria-label={tableName(node, title)}
    >
      <Table size="small">{children}</Table>
    </Box>
  );
}

function components(topLevel: number): Components {
  return {
    h1: heading(1, topLevel),
    h2: heading(2, topLevel),
    h3: heading(3, topLevel),
    h4: heading(4, topLevel),
    h5: heading(5, topLevel),
    h6: heading(6, topLevel),
    p: ({ children }: Props<'p'>) => (
      <Typography variant="body2" component="p" sx={{ my: 1 }}>
        {children}
      </Typography>
    ),
    ul: ({ children }: Props<'ul'>) => (
      <Box component="ul" sx={{ my: 1, pl: 3, typography: 'body2' }}>
        {children}
      </Box>
    ),
    ol: ({ children, start }: Props<'ol'>) => (
      <Box component="ol" start={start} sx={{ my: 1, pl: 3, typography: 'body2' }}>
        {children}
      </Box>
    ),
    li: ({ children }: Props<'li'>) => (
      <Box component="li" sx={{ mb: 0.5 }}>
        {children}
      </Box>
    ),
    a: ({ children, href }: Props<'a'>) => (
      <Link href={href} target="_blank" rel="noopener noreferrer">
        {children}
      </Link>
    ),
    // No pictures from the text (they would load from anywhere): their description stands in.
    img: ({ alt }: Props<'img'>) => (alt ? <span>{`[${alt}]`}</span> : null),
    table: MarkdownTable,
    thead: ({ children }: Props<'thead'>) => <TableHead>{children}</TableHead>,
    tbody: ({ children }: Props<'tbody'>) => <TableBody>{children}</TableBody>,
    tr: ({ children }: Props<'tr'>) => <TableRow>{children}</TableRow>,
    th: ({ children }: Props<'th'>) => (
      <TableCell component="th" scope="col" sx={{ verticalAlign: 'bottom', color: 'inherit' }}>
        {children}
      </TableCell>
    ),
    td: ({ children }: Props<'td'>) => (
      <TableCell sx={{ verticalAlign: 'top', color: 'inherit', overflowWrap: 'break-word' }}>
        {children}
      </TableCell>
    ),
  };
}

const CACHE = new Map<number, Components>();

/** The fewest `#`s of any ATX heading in the text, outside fenced code (1 when it has no heading). */
export function highestHeading(text: string): number {
  let fewest = Infinity;
  let fenced = false;
  for (const line of text.split('\n')) {
    if (/^ {0,3}(```|~~~)/.test(line)) fenced = !fenced;
    const m = fenced ? null : /^ {0,3}(#{1,6})[ \t]/.exec(line);
    if (m?.[1]) fewest = Math.min(fewest, m[1].length);
  }
  return Number.isFinite(fewest) ? fewest : 1;
}

/**
 * Workshop text written in Markdown (safety notices, local rules) as formatted text: headings, emphasis,
 * lists, links and tables. HTML in the text is dropped, never rendered, and links leave the app in a new tab.
 */
export function MarkdownText({
  children,
  title,
  topLevel = 3,
}: {
  /** The Markdown. */
  children: string;
  /** The title shown above the text; a first heading saying the same is left out. */
  title?: string;
  /** The HTML level a `#` heading of the text gets, below the page's own headings (default h3). */
  topLevel?: number;
}) {
  const text = withoutRepeatedTitle(children, title);
  // The text's highest heading takes `topLevel`, whatever its number of `#`s: a text whose headings start
  // at `##` would otherwise skip a level below the page's heading (WCAG 2.2, 1.3.1; common practice).
  const level = topLevel - (highestHeading(text) - 1);
  let parts = CACHE.get(level);
  if (!parts) {
    parts = components(level);
    CACHE.set(level, parts);
  }
  return (
    <Box sx={{ minWidth: 0, '& > :first-child': { mt: 0 }, '& > :last-child': { mb: 0 } }}>
      <TitleContext.Provider value={title}>
        <Markdown remarkPlugins={[remarkGfm]} skipHtml components={parts}>
          {text}
        </Markdown>
      </TitleContext.Provider>
    </Box>
  );
}
