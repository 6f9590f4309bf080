import { Typography } from 'antd';
import { GyreMark } from '../../../components/gyre-mark';
import { ResearchCaution } from '../../../components/research-caution';
import { GYRE_COLORS } from '../../../app/theme';
import '../auth.css';

/** The frame of every screen before sign-in: mark, name, one card, the caution. */
export function AuthLayout({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <main
      className="gyre-auth-backdrop"
      style={{
        background: `linear-gradient(160deg, ${GYRE_COLORS.mist} 0%, ${GYRE_COLORS.mistDeep} 100%)`,
      }}
    >
      <div className="gyre-shrinkable">
        <div className="gyre-auth-brand">
          <GyreMark size={40} />
          <div>
            <Typography.Title level={2} className="gyre-auth-name">
              Gyre
            </Typography.Title>
            <Typography.Text type="secondary">
              Alpha-frequency review for EEG studies
            </Typography.Text>
          </div>
        </div>
        {/* A plain card: antd's Card brings its tabs and menus into the first download. */}
        <section
          style={{
            background: GYRE_COLORS.paper,
            border: `1px solid ${GYRE_COLORS.line}`,
            borderRadius: 8,
            padding: 24,
          }}
        >
          <Typography.Title level={1} className="gyre-auth-title">
            {title}
          </Typography.Title>
          {children}
        </section>
        <div className="gyre-above">
          <ResearchCaution />
        </div>
      </div>
    </main>
  );
}
