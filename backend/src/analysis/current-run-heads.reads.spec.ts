import { CURRENT_STATES } from '../recordings/recordings.service';
import { CURRENT_RECORDING_STATES } from './current-run-heads.reads';

describe('current run heads', () => {
  it('counts the same recording states as current as the recordings module does', () => {
    expect([...CURRENT_RECORDING_STATES].sort()).toEqual([...CURRENT_STATES].sort());
  });
});
