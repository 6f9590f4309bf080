import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { RESEARCH_CAUTION, ResearchCaution } from './research-caution';

describe('ResearchCaution', () => {
  it('shows the research-use caution word for word', () => {
    render(<ResearchCaution />);
    expect(RESEARCH_CAUTION).toBe(
      'Research use only. Not a diagnostic device: do not use these results for clinical decisions. Follow your study protocol, local regulations and licensed clinicians.',
    );
    expect(screen.getByRole('note', { name: 'Research use caution' })).toHaveTextContent(
      RESEARCH_CAUTION,
    );
  });
});
