import { Button, Input } from 'antd';
import { SearchGlyph } from './state-icons';

type SearchProps = React.ComponentProps<typeof Input.Search>;

/**
 * antd's search field with a search button that has a name: antd's own button shows only an
 * icon, which a screen reader announces as a nameless "button". `searchLabel` names it.
 */
export function SearchInput({
  searchLabel = 'Search',
  ...props
}: Omit<SearchProps, 'enterButton'> & { searchLabel?: string }) {
  return (
    <Input.Search
      {...props}
      enterButton={<Button aria-label={searchLabel} icon={<SearchGlyph />} />}
    />
  );
}
