import './radiographs.css';
import { Card } from '@blueprintjs/core';
import { Link } from 'react-router-dom';
import { Can } from '../../../lib/ability';
import { RADIOGRAPH_KIND_LABEL } from '../../../lib/labels';
import { useRadiographs } from '../api/radiographs-api';
import { PreviewNotice } from './preview-notice';

/** The Site file's radiographs: thumbnails of those showing this site, each opening the viewer. */
export function SiteRadiographs({ patientId, siteId }: { patientId: string; siteId: string }) {
  const list = useRadiographs(patientId);
  const shown = list.data?.items.filter((r) => r.siteIds.includes(siteId)) ?? [];
  return (
    <Can I="read" a="Radiograph">
      <section className="site-radiographs" aria-labelledby="site-radiographs-heading">
        <h2 id="site-radiographs-heading">Radiographs</h2>
        {list.isPending ? (
          <p>Loading radiographs…</p>
        ) : list.isError ? (
          <p role="alert">The radiographs could not be loaded: {list.error.message}</p>
        ) : shown.length === 0 ? (
          <p>No radiograph shows this site yet.</p>
        ) : (
          <div className="radiograph-grid">
            {shown.map((r) => (
              <Card key={r.id} className="radiograph-card" data-testid="site-radiograph">
                <Link to={`/patients/${patientId}/radiographs/${r.id}`}>
                  {r.previewStatus !== 'ready' ? (
                    <PreviewNotice radiograph={r} compact />
                  ) : (
                    <img
                      src={`/api/radiographs/${r.id}/thumbnail`}
                      alt={`${RADIOGRAPH_KIND_LABEL[r.kind]} radiograph of ${r.takenOn ?? 'unknown date'}`}
                    />
                  )}
                </Link>
                <div>
                  {RADIOGRAPH_KIND_LABEL[r.kind]} {r.takenOn ?? 'date not known'}
                </div>
              </Card>
            ))}
          </div>
        )}
        <Link to={`/patients/${patientId}/radiographs`}>All radiographs and upload</Link>
      </section>
    </Can>
  );
}
