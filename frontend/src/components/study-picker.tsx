import type { StudyView } from '@gyre/shared';
import { Card, Form, Select } from 'antd';
import type { ReactNode } from 'react';
import { useSearchParams } from 'react-router-dom';

/**
 * An admin's choice among `studies`, kept in the address (`?study=`): the study named there,
 * else the only one there is, else none. `picker` is the card to choose with (`id` on its field).
 */
export function useStudyPicker(
  id: string,
  studies: StudyView[],
): { studyId: string | null; picker: ReactNode } {
  const [search, setSearch] = useSearchParams();
  const chosen = search.get('study');
  const studyId =
    studies.find((s) => s.id === chosen)?.id ?? (studies.length === 1 ? studies[0].id : null);
  const picker = (
    <Card className="gyre-below-md">
      <Form layout="vertical" component="div">
        <Form.Item label="Study" htmlFor={id} className="gyre-flush">
          <Select
            id={id}
            placeholder="Choose a study"
            value={studyId ?? undefined}
            onChange={(next: string) => setSearch({ study: next }, { replace: true })}
            options={studies.map((s) => ({ value: s.id, label: `${s.code} · ${s.name}` }))}
            style={{ maxWidth: 480, width: '100%' }}
          />
        </Form.Item>
      </Form>
    </Card>
  );
  return { studyId, picker };
}
