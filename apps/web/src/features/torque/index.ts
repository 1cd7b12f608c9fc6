// The torque feature's public surface, used by the Site file and the planner's restorations.
export { LogTorquePanel } from './components/log-torque-panel';
export { SeatRestorationForm } from './components/seat-restoration-form';
export { useWrenches, useSaveWrench, useRecordCalibration, useSaveWrenchSettings } from './api/wrenches';
