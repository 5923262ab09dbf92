// Status shown as text and a shape, not colour alone (WCAG 2.1 SC 1.4.1 Use of Color); the
// 30-day "due soon" window is common practice, no source.
import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { DueStateText } from '../../src/features/standards/components/due-state';

describe('DueStateText', () => {
  it('says overdue in words with the number of days, the icon hidden from screen readers', () => {
    const { container } = render(<DueStateText due="overdue" daysToDue={-5} />);
    expect(screen.getByText('Overdue by 5 days')).toBeTruthy();
    expect(container.querySelector('[aria-hidden="true"]')?.textContent).toBe('▲');
  });
  it('says due soon with the days left, and due today on the day', () => {
    render(<DueStateText due="due_soon" daysToDue={1} />);
    expect(screen.getByText('Due soon: in 1 day')).toBeTruthy();
    render(<DueStateText due="due_soon" daysToDue={0} />);
    expect(screen.getByText('Due today')).toBeTruthy();
  });
  it('says in date otherwise', () => {
    render(<DueStateText due="ok" daysToDue={200} />);
    expect(screen.getByText('In date')).toBeTruthy();
  });
});
