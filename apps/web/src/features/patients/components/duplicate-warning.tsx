import { Button, Callout } from '@blueprintjs/core';
import type { DuplicateCheckReply } from '@torquetrail/contracts';
import { Link } from 'react-router-dom';
import { formatDate } from '../../../lib/dates';
import { ChartNumber } from '../../../lib/components/chart-number';

/** The practice's patients with the same family name and birth date, shown before saving. */
export function DuplicateWarning({
  matches,
  onSaveAnyway,
  saving,
}: {
  matches: DuplicateCheckReply['matches'];
  onSaveAnyway?: () => void;
  saving?: boolean;
}) {
  return (
    <Callout intent="warning" title="This may be a patient you already have" data-testid="duplicate-warning">
      <p>Same family name and date of birth:</p>
      <ul>
        {matches.map((m) => (
          <li key={m.id}>
            <Link to={`/patients/${m.id}`} target="_blank" rel="noopener">
              {m.familyName}, {m.givenName} · <ChartNumber value={m.chartNumber} /> · born {formatDate(m.birthDate)}
              {m.archivedAt ? ' (archived)' : ''}
            </Link>
          </li>
        ))}
      </ul>
      {onSaveAnyway && (
        <>
          <p>Open the record above to check it. If this is a different person, save anyway.</p>
          <Button intent="warning" onClick={onSaveAnyway} loading={saving} data-testid="save-anyway">
            Save anyway
          </Button>
        </>
      )}
    </Callout>
  );
}
