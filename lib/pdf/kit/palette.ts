import "server-only";
// The one palette of Caddis's PDFs (the booklet and the GP summary), from the app's theme
// (tailwind.config.ts): text at 4.5:1 or more on its fill, as on screen.
export const palette = {
  brand: "#0b5563",
  brandSoft: "#dcebec",
  ink: "#1c1f21",
  inkSoft: "#4f565b",
  line: "#8c8678",
  faint: "#d9d3c6",
  sunk: "#f1ece1",
  paper: "#ffffff",
  /** Strong colour and its soft fill for each tone of a notice. */
  tone: {
    stop: { strong: "#a4231b", soft: "#fbe6e3" },
    warn: { strong: "#8a4b00", soft: "#fdf0d9" },
    info: { strong: "#1f4e99", soft: "#e3ecfa" },
  },
} as const;
