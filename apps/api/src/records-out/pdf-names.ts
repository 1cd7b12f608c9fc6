// File names safe in a Content-Disposition header and a mail attachment, whatever the chart number holds.
const safe = (chartNumber: string) => chartNumber.replace(/[^A-Za-z0-9_-]+/g, '_').slice(0, 40);

export const passportFilename = (chartNumber: string) => `implant-passport-${safe(chartNumber)}.pdf`;
export const retrievalCardFilename = (chartNumber: string) => `retrieval-card-${safe(chartNumber)}.pdf`;
export const fhirFilename = (chartNumber: string) => `patient-${safe(chartNumber)}.fhir.json`;
