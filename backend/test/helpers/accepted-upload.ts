import type { RecordingView } from '@gyre/shared';
import { upload, type UploadInput } from '../recordings-fixtures';
import type { TestApp } from './test-app';

/** Uploads as the site A1 technician on visit A1 (or `visitId`) and expects 201: the recording. */
export async function acceptedUpload(
  t: TestApp,
  input: UploadInput,
  visitId = t.seed.visits.A1.id,
): Promise<RecordingView> {
  const response = await upload(t, 'technician', visitId, input);
  expect(response.status).toBe(201);
  return response.body as RecordingView;
}
