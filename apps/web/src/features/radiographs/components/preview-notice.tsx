import { Callout, Spinner } from '@blueprintjs/core';
import type { Radiograph } from '@torquetrail/contracts';
import { RADIOGRAPH_PREVIEW_STATUS_LABEL } from '../../../lib/labels';

/**
 * Stands in for the preview image while it is not ready: being prepared (the lists poll until it
 * is, see radiographs-api.ts), or unavailable with the server's reason. `compact` for thumbnails.
 */
export function PreviewNotice({ radiograph: r, compact = false }: { radiograph: Radiograph; compact?: boolean }) {
  if (r.previewStatus === 'pending') {
    const retrying = r.previewAttempts > 0 ? ' (retrying after a storage problem)' : '';
    return compact ? (
      <span className="radiograph-preview-pending" role="status" data-testid="preview-pending">
        <Spinner size={16} /> {RADIOGRAPH_PREVIEW_STATUS_LABEL.pending}
        {retrying}
      </span>
    ) : (
      <Callout intent="primary" icon={<Spinner size={16} />} role="status" data-testid="preview-pending">
        {RADIOGRAPH_PREVIEW_STATUS_LABEL.pending}
        {retrying}. It appears here by itself when it is ready.
      </Callout>
    );
  }
  const problem = r.previewProblem ?? RADIOGRAPH_PREVIEW_STATUS_LABEL.unavailable;
  return compact ? (
    <span className="radiograph-no-preview">{problem}</span>
  ) : (
    <Callout intent="warning">{problem}</Callout>
  );
}
