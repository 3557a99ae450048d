// Codes as a fake camera: a GS1 DataMatrix packaging label or a passport QR, drawn with bwip-js
// (which also refuses a wrong GS1 check digit), written as a few frames of a YUV4MPEG2 (.y4m)
// file that Chromium plays as its camera with --use-file-for-fake-video-capture.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import bwipjs from "bwip-js/node";
import { PNG } from "pngjs";

const WIDTH = 640;
const HEIGHT = 480;

export async function gs1DataMatrixPng(bracketed: string): Promise<Buffer> {
  return bwipjs.toBuffer({ bcid: "gs1datamatrix", text: bracketed, scale: 10, paddingwidth: 4, paddingheight: 4, backgroundcolor: "FFFFFF" });
}

/** Writes the label, centred on a white 640×480 frame, as `frames` frames of 4:2:0 video. */
export async function writeLabelVideo(bracketed: string, frames = 10): Promise<string> {
  return writeVideo(PNG.sync.read(await gs1DataMatrixPng(bracketed)), { fill: 0.6, frames, name: "label" });
}

/** A linear GS1-128 label (bwip-js puts FNC1 first and between variable fields, as printers do). */
export async function writeGs1128Video(bracketed: string, frames = 10): Promise<string> {
  const png = await bwipjs.toBuffer({ bcid: "gs1-128", text: bracketed, scale: 1, height: 12, paddingwidth: 12, paddingheight: 6, backgroundcolor: "FFFFFF" });
  return writeVideo(PNG.sync.read(png), { fill: 0.95, frames, name: "gs1-128" });
}

/** Writes a QR of `text` (a passport address) the same way. */
export async function writeQrVideo(text: string, frames = 10): Promise<string> {
  const png = PNG.sync.read(await bwipjs.toBuffer({ bcid: "qrcode", text, scale: 6, paddingwidth: 6, paddingheight: 6, backgroundcolor: "FFFFFF" }));
  return writeVideo(png, { fill: 0.8, frames, name: "qr" });
}

/** The image scaled to `fill` of the frame, centred on white, as a .y4m file; returns its path. */
function writeVideo(png: PNG, { fill, frames, name }: { fill: number; frames: number; name: string }): string {
  const y = Buffer.alloc(WIDTH * HEIGHT, 235);
  const scale = Math.max(1, Math.floor(Math.min((WIDTH * fill) / png.width, (HEIGHT * fill) / png.height)));
  const w = png.width * scale;
  const h = png.height * scale;
  const x0 = Math.floor((WIDTH - w) / 2);
  const y0 = Math.floor((HEIGHT - h) / 2);
  for (let py = 0; py < h; py++) {
    for (let px = 0; px < w; px++) {
      const i = (Math.floor(py / scale) * png.width + Math.floor(px / scale)) * 4;
      // BT.601 luma from RGB; the codes are black on white, so chroma stays neutral.
      const luma = 0.299 * png.data[i] + 0.587 * png.data[i + 1] + 0.114 * png.data[i + 2];
      y[(y0 + py) * WIDTH + (x0 + px)] = Math.round(16 + (luma * 219) / 255);
    }
  }
  const chroma = Buffer.alloc((WIDTH / 2) * (HEIGHT / 2), 128);
  const header = Buffer.from(`YUV4MPEG2 W${WIDTH} H${HEIGHT} F10:1 Ip A1:1 C420jpeg\n`);
  const frame = Buffer.concat([Buffer.from("FRAME\n"), y, chroma, chroma]);
  const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), `caddis-${name}-camera-`)), `${name}.y4m`);
  fs.writeFileSync(file, Buffer.concat([header, ...Array.from({ length: frames }, () => frame)]));
  return file;
}
