/** The entered local date and time as an instant; left as typed when it is no date, for the contract to refuse. */
export const instant = (local: string) => {
  const d = new Date(local);
  return Number.isNaN(d.getTime()) ? local : d.toISOString();
};
