// A passport QR as a fake camera, as tests/e2e/support/fake-camera.ts does for packaging labels:
// the QR drawn with bwip-js, written as frames of a YUV4MPEG2 (.y4m) file for Chromium's
// --use-file-for-fake-video-capture.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import bwipjs from "bwip-js/node";
import { PNG } from "pngjs";

const WIDTH = 640;
const HEIGHT = 480;

export async function writeQrVideo(text: string, frames = 10): Promise<string> {
  const png = PNG.sync.read(await bwipjs.toBuffer({ bcid: "qrcode", text, scale: 6, paddingwidth: 6, paddingheight: 6, backgroundcolor: "FFFFFF" }));
  const y = Buffer.alloc(WIDTH * HEIGHT, 235);
  const scale = Math.max(1, Math.floor(Math.min((WIDTH * 0.8) / png.width, (HEIGHT * 0.8) / png.height)));
  const w = png.width * scale;
  const h = png.height * scale;
  const x0 = Math.floor((WIDTH - w) / 2);
  const y0 = Math.floor((HEIGHT - h) / 2);
  for (let py = 0; py < h; py++) {
    for (let px = 0; px < w; px++) {
      const i = (Math.floor(py / scale) * png.width + Math.floor(px / scale)) * 4;
      const luma = 0.299 * png.data[i] + 0.587 * png.data[i + 1] + 0.114 * png.data[i + 2];
      y[(y0 + py) * WIDTH + (x0 + px)] = Math.round(16 + (luma * 219) / 255);
    }
  }
  const chroma = Buffer.alloc((WIDTH / 2) * (HEIGHT / 2), 128);
  const header = Buffer.from(`YUV4MPEG2 W${WIDTH} H${HEIGHT} F10:1 Ip A1:1 C420jpeg\n`);
  const frame = Buffer.concat([Buffer.from("FRAME\n"), y, chroma, chroma]);
  const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "caddis-qr-camera-")), "qr.y4m");
  fs.writeFileSync(file, Buffer.concat([header, ...Array.from({ length: frames }, () => frame)]));
  return file;
}
