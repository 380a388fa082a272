import { render } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { breakableFileName } from './cut-pack-panel';

describe('cut pack file names', () => {
  it('may wrap before an extension, so a narrow column never breaks a name inside a word', () => {
    const { container } = render(<span>{breakableFileName('manifest.json')}</span>);
    // The only break offered is before the dot; the cell no longer breaks anywhere ("manifest.jso" / "n").
    expect(container.firstElementChild?.innerHTML).toBe('manifest<wbr>.json');
    expect(container.textContent).toBe('manifest.json');
  });

  it('keeps every character of a long name, hyphens and all, in its order', () => {
    const name = 'cut-pack-reading-room-lamp-415d7a69.zip';
    const { container } = render(<span>{breakableFileName(name)}</span>);
    expect(container.textContent).toBe(name);
    expect(container.querySelectorAll('wbr')).toHaveLength(1);
  });

  it('adds nothing to a name without a dot', () => {
    const { container } = render(<span>{breakableFileName('README')}</span>);
    expect(container.firstElementChild?.innerHTML).toBe('README');
  });
});
