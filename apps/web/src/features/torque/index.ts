import './components/torque.css';
// The torque feature's public surface, used by the Site file.
export { LogTorquePanel } from './components/log-torque-panel';
export { useWrenches, useSaveWrench, useRecordCalibration } from './api/wrenches';
