// Exams and torque entries are discrete events: a chart joins them with straight lines. A smoothed
// curve would draw values between visits that were never measured (recharts' `monotone`,
// `basis`, `natural`, … interpolate). Reads every component, so a new chart is covered.
import { describe, expect, it } from 'vitest';

const components = import.meta.glob<string>('../**/*.tsx', { query: '?raw', import: 'default', eager: true });
const SMOOTHED = /type=["'{](monotone\w*|basis\w*|natural|cardinal|catmullRom|bump\w*)["'}]/;

describe('charts of discrete exams and entries', () => {
  const charts = Object.entries(components).filter(([, source]) => source.includes("from 'recharts'"));

  it('finds the charts it checks', () => {
    expect(charts.length).toBeGreaterThanOrEqual(2);
    expect(SMOOTHED.test('<Line type="monotone" />')).toBe(true);
  });

  it('draws no smoothed line between measurements', () => {
    expect(charts.filter(([, source]) => SMOOTHED.test(source)).map(([file]) => file)).toEqual([]);
  });
});
