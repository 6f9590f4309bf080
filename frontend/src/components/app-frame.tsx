import { Button, Drawer, Flex, Grid, Layout, Menu } from 'antd';
import type { MenuProps } from 'antd';
import { useState } from 'react';
import { Link, Outlet, useLocation } from 'react-router-dom';
import { GyreMark } from './gyre-mark';
import { MenuGlyph } from './state-icons';
import { paths } from '../app/paths';
import './app-frame.css';

export interface NavItem {
  path: string;
  label: string;
}

/** The id of the main landmark, which the skip link moves the focus to. */
export const MAIN_ID = 'main';

/** Moves the focus into the main landmark (a router-free stand-in for following `#main`). */
function skipToMain(event: React.MouseEvent<HTMLAnchorElement>) {
  event.preventDefault();
  document.getElementById(MAIN_ID)?.focus();
}

/**
 * The frame around every signed-in screen: a skip link, the header (product name, navigation,
 * who is signed in) and the main landmark. From antd's `lg` breakpoint up the menu runs along
 * the header; below it (phones, narrow tablets) a menu button opens it in a drawer, so no entry
 * is ever squeezed out of sight.
 */
export function AppFrame({
  navItems = [],
  aside,
}: {
  navItems?: NavItem[];
  aside?: React.ReactNode;
}) {
  const location = useLocation();
  // Before its first measurement antd answers `undefined`: treated as wide.
  const wide = Grid.useBreakpoint().lg !== false;
  const [drawerOpen, setDrawerOpen] = useState(false);
  const selected = navItems
    .filter((item) => location.pathname.startsWith(item.path))
    .map((item) => item.path);
  const items: MenuProps['items'] = navItems.map((item) => ({
    key: item.path,
    label: <Link to={item.path}>{item.label}</Link>,
  }));
  return (
    <Layout className={wide ? 'gyre-full-height' : 'gyre-full-height gyre-frame-narrow'}>
      <a href={`#${MAIN_ID}`} className="gyre-skip-link" onClick={skipToMain}>
        Skip to main content
      </a>
      <Layout.Header className="gyre-frame-header">
        {!wide && (
          <Button
            type="text"
            aria-label="Open the menu"
            aria-expanded={drawerOpen}
            icon={<MenuGlyph />}
            onClick={() => setDrawerOpen(true)}
            className="gyre-no-shrink"
          />
        )}
        <Link to={paths.home} className="gyre-brand" aria-label="Gyre home">
          <GyreMark />
          <span className="gyre-brand-name">Gyre</span>
        </Link>
        {wide && (
          <nav aria-label="Main" className="gyre-frame-nav">
            <Menu mode="horizontal" selectedKeys={selected} items={items} style={{ border: 0 }} />
          </nav>
        )}
        <Flex justify="flex-end" className="gyre-frame-aside">
          {aside}
        </Flex>
      </Layout.Header>
      {!wide && (
        <Drawer
          title="Menu"
          placement="left"
          size={280}
          open={drawerOpen}
          onClose={() => setDrawerOpen(false)}
          styles={{ body: { padding: 8 } }}
        >
          <nav aria-label="Main">
            <Menu
              mode="inline"
              selectedKeys={selected}
              items={items}
              style={{ border: 0 }}
              onClick={() => setDrawerOpen(false)}
            />
          </nav>
        </Drawer>
      )}
      <Layout.Content id={MAIN_ID} tabIndex={-1} className="gyre-frame-main">
        <Outlet />
      </Layout.Content>
    </Layout>
  );
}
