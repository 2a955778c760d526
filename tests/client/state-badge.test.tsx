import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { StateBadge } from '../../src/components/ui/state-badge';
import { StateGlyph } from '../../src/components/ui/state-glyph';
import { UNIT_STATES, stateLabel, type UnitStateName } from '../../src/lib/unit-state';

const all: (UnitStateName | null)[] = [...UNIT_STATES, null];

describe('the state badge', () => {
  it('writes each state\'s label in words', () => {
    for (const s of all) expect(renderToStaticMarkup(<StateBadge state={s} />)).toContain(`>${stateLabel(s)}<`);
  });

  it('gives every state a different shape, so colour is never the only cue', () => {
    const shapes = all.map((s) => renderToStaticMarkup(<StateGlyph state={s} />));
    expect(new Set(shapes).size).toBe(all.length);
  });

  it('gives every state a different colour class', () => {
    const colour = (s: UnitStateName | null) => /text-state-\w+/.exec(renderToStaticMarkup(<StateBadge state={s} />))?.[0];
    expect(new Set(all.map(colour)).size).toBe(all.length);
  });

  it('shows the countdown beside "Purge in progress"', () => {
    const html = renderToStaticMarkup(<StateBadge state="purging" detail="1:34 left" />);
    expect(html).toContain('Purge in progress');
    expect(html).toContain('1:34 left');
  });

  it('hides the glyph from screen readers, which read the label instead', () => {
    expect(renderToStaticMarkup(<StateGlyph state="interrupted" />)).toContain('aria-hidden="true"');
  });
});
