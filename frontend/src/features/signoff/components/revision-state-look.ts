import type { RevisionState } from '@gyre/shared';
import { GYRE_COLORS } from '../../../app/theme';
import type { StateLook } from '../../../components/table-columns';

/** How a signed revision's state shows as a tag. */
export const REVISION_STATE_LOOK: Record<RevisionState, StateLook> = {
  signed: { label: 'Signed', color: GYRE_COLORS.primary },
  sent: { label: 'Sent', color: 'success' },
};
