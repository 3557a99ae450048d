import { chromium } from "playwright-core";
const base = "http://localhost:3201";
const [,, email, password, ...paths] = process.argv;
const browser = await chromium.launch({ executablePath: "/usr/bin/chromium", args: ["--headless", "--no-sandbox", "--disable-gpu"] });
for (const width of [1280, 390]) {
  const ctx = await browser.newContext({ baseURL: base, viewport: { width, height: 900 } });
  const page = await ctx.newPage();
  page.on("console", (m) => { if (m.type() === "error") console.log("console:", m.text()); });
  await page.goto("/en/sign-in");
  await page.locator('input[type="email"]').fill(email);
  await page.locator('input[type="password"]').fill(password);
  await page.locator('button[type="submit"]').click();
  await page.waitForURL((u) => !u.pathname.endsWith("/sign-in") && !u.pathname.endsWith("/home"), { timeout: 60000 });
  for (const p of paths) {
    const [path, name] = p.split("=");
    const res = await page.goto(path, { timeout: 120000 });
    await page.waitForTimeout(800);
    console.log(width, path, res.status());
    await page.screenshot({ path: `/tmp/shots/${name}-${width}.png`, fullPage: true });
  }
  await ctx.close();
}
await browser.close();
