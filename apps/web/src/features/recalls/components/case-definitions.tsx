import { Button, PopoverNext } from '@blueprintjs/core';
import {
  DEFAULT_BONE_LOSS_MM,
  DEFAULT_PD_INCREASE_MM,
  NO_BASELINE_BONE_LEVEL_MM,
  NO_BASELINE_PD_MM,
} from '@torquetrail/domain';

/**
 * The three case definitions and the no-baseline rule, in our own words, on demand. PopoverNext
 * (floating-ui) is Blueprint's popover for React 19: the classic Popover warns that it positions
 * its content wrongly there.
 */
export function CaseDefinitions() {
  return (
    <PopoverNext
      content={
        <div className="definitions" data-testid="case-definitions">
          <p>
            The status is computed from the 2017 World Workshop case definitions (Berglundh et al. 2018 consensus
            report). It supports, and never replaces, the clinician&apos;s diagnosis.
          </p>
          <dl>
            <dt>Peri-implant health</dt>
            <dd>
              No bleeding or suppuration on gentle probing. No probing-depth range defines health; it can exist with
              reduced bone support.
            </dd>
            <dt>Peri-implant mucositis</dt>
            <dd>Bleeding and/or suppuration on gentle probing, without bone loss beyond the initial remodelling.</dd>
            <dt>Peri-implantitis</dt>
            <dd>
              Bleeding and/or suppuration, probing depths deeper than at the baseline (by {DEFAULT_PD_INCREASE_MM} mm or
              more here), and bone loss since the baseline beyond the initial remodelling ({DEFAULT_BONE_LOSS_MM} mm or
              more here).
            </dd>
            <dt>Without a baseline</dt>
            <dd>
              Peri-implantitis needs all three: bleeding and/or suppuration, a probing depth of {NO_BASELINE_PD_MM} mm
              or more, and a bone level {NO_BASELINE_BONE_LEVEL_MM} mm or more apical to the most coronal part of the
              implant inside bone. Without a radiographic bone level it cannot be confirmed or excluded.
            </dd>
          </dl>
          <p>
            Baseline: the first exam after the restoration was delivered, or an exam marked as baseline (it needs a bone
            level).
          </p>
        </div>
      }
    >
      <Button variant="minimal" icon="info-sign" text="Case definitions" />
    </PopoverNext>
  );
}
