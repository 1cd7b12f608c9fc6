import { SegmentedControl } from '@blueprintjs/core';
import { type ToothSystem, useToothSystem } from '../../../lib/tooth-system';

const OPTIONS = [
  { label: 'FDI', value: 'fdi' },
  { label: 'Universal', value: 'universal' },
];

/** FDI / Universal, remembered on this device as a display preference. */
export function NumberingSwitch() {
  const [system, setSystem] = useToothSystem();
  // SegmentedControl passes HTML attributes through, but its props type does not list aria-*.
  const labelled: Record<string, string> = { 'aria-labelledby': 'numbering-switch-label' };
  return (
    <div className="numbering-switch">
      <span id="numbering-switch-label" className="numbering-switch__label">
        Numbering
      </span>
      <SegmentedControl
        {...labelled}
        options={OPTIONS}
        value={system}
        onValueChange={(value) => setSystem(value as ToothSystem)}
        size="small"
      />
    </div>
  );
}
