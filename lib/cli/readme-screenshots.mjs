// npm run screenshots:readme — the README's pictures, taken from the browser tests' screenshots.
// Run the browser tests first (they save every screen at 1366 and 390 px into tests/e2e/screenshots/);
// this keeps the top of each page (what the window shows, a little more) and writes it as a palette PNG
// into tests/e2e/readme/. sharp comes with Next.js (its image optimiser), so nothing new is installed.
import fs from 'node:fs';
import path from 'node:path';

const FROM = 'tests/e2e/screenshots';
const TO = 'tests/e2e/readme';

/** README picture ← browser test screenshot (the test that saves it is named in the README). */
const PICTURES = [
  ['overview-laptop', 'dashboard-host-laptop'],
  ['layout-diagram-laptop', 'layout-overview-diagram-laptop'],
  ['layout-power-laptop', 'power-tables-laptop'],
  ['builder-laptop', 'builder-laptop'],
  ['builder-track-laptop', 'builder-track-laptop'],
  ['invitations-laptop', 'invitations-tracker-changed-laptop'],
  ['live-board-laptop', 'live-board-laptop'],
  ['builder-phone', 'builder-phone'],
  ['my-runs-phone', 'my-runs-operator-phone'],
  ['crew-card-phone', 'crew-card-phone'],
  ['live-my-runs-phone', 'live-my-runs-phone'],
];

// The height kept: a laptop window and a little more; on a phone, about two screens.
const KEEP = { laptop: 1000, phone: 1500 };

async function main() {
  let sharp;
  try {
    sharp = (await import('sharp')).default;
  } catch {
    console.error('sharp is missing: it is installed with Next.js on supported platforms (npm ci).');
    process.exit(1);
  }
  fs.mkdirSync(TO, { recursive: true });
  const missing = PICTURES.filter(([, source]) => !fs.existsSync(path.join(FROM, `${source}.png`)));
  if (missing.length) {
    console.error(`Missing in ${FROM}: ${missing.map(([, s]) => s).join(', ')}. Run the browser tests first (npm run test:e2e).`);
    process.exit(1);
  }
  for (const [name, source] of PICTURES) {
    const file = path.join(FROM, `${source}.png`);
    const { width = 0, height = 0 } = await sharp(file).metadata();
    const keep = Math.min(height, name.endsWith('-phone') ? KEEP.phone : KEEP.laptop);
    const out = path.join(TO, `${name}.png`);
    await sharp(file).extract({ left: 0, top: 0, width, height: keep }).png({ palette: true, quality: 80, compressionLevel: 9, effort: 10 }).toFile(out);
    console.log(`${out}  ${width}×${keep}  ${Math.round(fs.statSync(out).size / 1024)} KiB`);
  }
}

await main();
