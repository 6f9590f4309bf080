import type { ReportState } from '@gyre/shared';
import { Tag } from 'antd';

const LOOK: Record<ReportState, { label: string; color: string }> = {
  draft: { label: 'Draft', color: 'default' },
  signed: { label: 'Signed', color: 'processing' },
  sent: { label: 'Sent', color: 'success' },
};

export function ReportStateTag({ state }: { state: ReportState }) {
  return <Tag color={LOOK[state].color}>{LOOK[state].label}</Tag>;
}
