import { Callout, Spinner, Switch } from '@blueprintjs/core';
import { runMutation } from '../../../lib/run-mutation';
import { useImpressionSettings, useSaveImpressionSettings } from '../api/impressions-api';

/**
 * The practice's impression rule (admin): ask for a radiograph of the seated scan bodies of every
 * digital impression. Off by default; when on, an impression without one shows a Finding.
 */
export function ImpressionSettingsSwitch() {
  const settings = useImpressionSettings();
  const save = useSaveImpressionSettings();
  if (settings.isPending) return <Spinner size={16} aria-label="Loading the impression settings" />;
  if (settings.isError) return <Callout intent="danger">The impression settings could not be loaded.</Callout>;
  return (
    <div className="impression-settings">
      <Switch
        checked={settings.data.requireScanBodyRadiograph}
        disabled={save.isPending}
        label="Ask for a radiograph of the seated scan bodies of each digital impression"
        data-testid="require-scan-body-radiograph"
        onChange={(event) => runMutation(save, { requireScanBodyRadiograph: event.currentTarget.checked })}
      />
      {save.isError && (
        <Callout intent="danger" role="alert" compact>
          {save.error.message}
        </Callout>
      )}
    </div>
  );
}
