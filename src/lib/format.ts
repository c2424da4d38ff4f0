const dateTime = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short' });

export const formatDateTime = (iso: string) => dateTime.format(new Date(iso));

/** Seconds with two decimals: "60.00 s". */
export const formatSeconds = (s: number) => `${s.toFixed(2)} s`;

const plain = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 3, useGrouping: false });

/** "48000 Hz"; no grouping, so the number reads as it is typed. */
export const formatHz = (hz: number) => `${plain.format(hz)} Hz`;

const megabytes = new Intl.NumberFormat('en-GB', { minimumFractionDigits: 2, maximumFractionDigits: 2 });
const smallMegabytes = new Intl.NumberFormat('en-GB', { minimumFractionDigits: 3, maximumFractionDigits: 3 });

/** 1 MB = 10⁶ bytes. Below 1 MB a third decimal, so a small CSV does not read as 0.00 MB. */
export const formatMegabytes = (bytes: number) => {
  const mb = bytes / 1e6;
  return `${(mb < 1 ? smallMegabytes : megabytes).format(mb)} MB`;
};
