// What a printed page says of itself: the patient (name, chart number, date of birth), the
// practice, who printed it and when, in the header and footer of every printed page. The browser
// draws them in the page margins (@page margin boxes), which it repeats on each sheet, so a sheet
// that comes loose from the rest still says whose it is and where it came from. The same words sit
// hidden in the page, where tests and assistive tools can find them.
import type { Me } from '@torquetrail/contracts';
import { useEffect, useState } from 'react';
import { useMatches } from 'react-router-dom';
import { usePatient } from '../features/patients';
import { useAfterFirstPaint } from '../lib/components/after-first-paint';
import { formatDate, formatDateTime } from '../lib/dates';

/** The patient of the page, when its path names one (the Arch, a Site file, plans, exams …). */
function usePatientOfPage(): string | null {
  const matches = useMatches();
  return matches.at(-1)?.params.patientId ?? null;
}

/**
 * The moment of printing: set again when the browser starts a print, so the footer is never stale.
 * First set once the page has been painted, not as it renders: writing an instant needs Intl (the
 * viewer's time zone), whose first use on a page costs tens of ms of ICU start-up on the main
 * thread, and the first view has no use for the footer, which only paper shows (issue 13, goal 3).
 */
function usePrintMoment(): Date | null {
  const painted = useAfterFirstPaint();
  const [at, setAt] = useState<Date | null>(null);
  useEffect(() => {
    const update = () => setAt(new Date());
    if (painted) update();
    window.addEventListener('beforeprint', update);
    return () => window.removeEventListener('beforeprint', update);
  }, [painted]);
  return at;
}

/** A CSS string literal (quotes and backslashes escaped, line breaks as spaces). */
const cssString = (text: string) => `"${text.replace(/[\\"]/g, (c) => `\\${c}`).replace(/\s+/g, ' ')}"`;

/** Puts the header and footer into the page margins of every printed sheet, for as long as the page shows. */
function usePageMargins(header: string, footer: string) {
  useEffect(() => {
    const sheet = new CSSStyleSheet();
    const box = `font-family: 'Noto Sans', sans-serif; font-size: 8pt; color: #333;`;
    sheet.replaceSync(`@media print {
  @page {
    margin: 20mm 12mm 16mm;
    @top-left { content: ${cssString(header)}; ${box} vertical-align: bottom; }
    @bottom-left { content: ${cssString(footer)}; ${box} vertical-align: top; }
    @bottom-right { content: "page " counter(page) " of " counter(pages); ${box} vertical-align: top; }
  }
}`);
    document.adoptedStyleSheets = [...document.adoptedStyleSheets, sheet];
    return () => {
      document.adoptedStyleSheets = document.adoptedStyleSheets.filter((s) => s !== sheet);
    };
  }, [header, footer]);
}

export function PrintFrame({ me }: { me: Me }) {
  const patientId = usePatientOfPage();
  const patient = usePatient(patientId ?? '', { enabled: patientId !== null });
  const at = usePrintMoment();
  const p = patientId ? patient.data : undefined;
  const who = p
    ? `${p.givenName} ${p.familyName} · chart ${p.chartNumber} · born ${formatDate(p.birthDate)}`
    : patientId
      ? 'Patient record (not loaded)'
      : null;
  const header = [who, me.practiceName].filter(Boolean).join(' · ');
  const footer = at
    ? `Printed by ${me.displayName} on ${formatDateTime(at.toISOString())}`
    : `Printed by ${me.displayName}`;
  usePageMargins(header, footer);
  return (
    <div className="print-frame" aria-hidden="true">
      {p && <span data-testid="print-patient">{who}</span>}
      <span data-testid="print-header">{header}</span>
      <span data-testid="print-footer">{footer}</span>
    </div>
  );
}
