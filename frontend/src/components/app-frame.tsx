import { Grid, Layout, Menu, Typography } from 'antd';
import type { MenuProps } from 'antd';
import { Link, Outlet, useLocation } from 'react-router-dom';
import { GyreMark } from './gyre-mark';
import { paths } from '../app/paths';

export interface NavItem {
  path: string;
  label: string;
}

/** The frame around every signed-in screen: product name, navigation, content. */
export function AppFrame({
  navItems = [],
  aside,
}: {
  navItems?: NavItem[];
  aside?: React.ReactNode;
}) {
  const location = useLocation();
  // Below `md` (a phone) the menu takes its own row, so it is never squeezed out by the user menu.
  const wide = Grid.useBreakpoint().md !== false;
  const selected = navItems
    .filter((item) => location.pathname.startsWith(item.path))
    .map((item) => item.path);
  const items: MenuProps['items'] = navItems.map((item) => ({
    key: item.path,
    label: <Link to={item.path}>{item.label}</Link>,
  }));
  return (
    <Layout style={{ minHeight: '100vh' }}>
      <Layout.Header
        style={{
          display: 'flex',
          alignItems: 'center',
          gap: wide ? 24 : 8,
          borderBottom: '1px solid #DCE5E6',
          ...(wide
            ? {}
            : { flexWrap: 'wrap', height: 'auto', lineHeight: 1.5, padding: '8px 12px 0' }),
        }}
      >
        <Link
          to={paths.home}
          style={{ display: 'flex', alignItems: 'center', gap: 10 }}
          aria-label="Gyre home"
        >
          <GyreMark />
          <Typography.Text strong style={{ fontSize: 19, letterSpacing: 0.4, color: '#24525A' }}>
            Gyre
          </Typography.Text>
        </Link>
        <nav
          aria-label="Main"
          style={wide ? { flex: 1, minWidth: 0 } : { flex: '1 1 100%', minWidth: 0, order: 3 }}
        >
          <Menu mode="horizontal" selectedKeys={selected} items={items} style={{ border: 0 }} />
        </nav>
        {wide ? aside : <div style={{ marginLeft: 'auto' }}>{aside}</div>}
      </Layout.Header>
      <Layout.Content
        style={{
          padding: wide ? '28px 32px' : '16px 12px',
          maxWidth: 1440,
          width: '100%',
          margin: '0 auto',
        }}
      >
        <Outlet />
      </Layout.Content>
    </Layout>
  );
}
