import type { MetadataRoute } from "next";

// Installable on a phone: icons drawn from the Caddis mark (scripts/render-icons.ts makes the PNGs).
export default function manifest(): MetadataRoute.Manifest {
  return {
    name: "Caddis",
    short_name: "Caddis",
    description: "Your catheter record, wherever you go.",
    start_url: "/",
    scope: "/",
    display: "standalone",
    orientation: "portrait",
    background_color: "#faf7f0",
    theme_color: "#0b5563",
    icons: [
      { src: "/icon-192.png", sizes: "192x192", type: "image/png", purpose: "any" },
      { src: "/icon-512.png", sizes: "512x512", type: "image/png", purpose: "any" },
      { src: "/icon-maskable-512.png", sizes: "512x512", type: "image/png", purpose: "maskable" },
      { src: "/icon.svg", sizes: "any", type: "image/svg+xml" },
    ],
  };
}
