// Writes invented borescope-like stills (JPEG) to a folder, for trying uploads by hand:
//   pnpm demo-images [folder] [count]
import fs from 'node:fs';
import path from 'node:path';
import {
  borescopeScene,
  randomMarks,
  type DemoMarkKind,
} from '../apps/server/src/demo/demo-images';
import { rasteriseSvg } from '../apps/server/src/lib/images/image-pipeline';

const folder = path.resolve(process.argv[2] ?? 'data/demo-stills');
const count = Number(process.argv[3] ?? 12);
const marks: DemoMarkKind[][] = [
  ['crack'],
  ['burn'],
  ['coating-loss'],
  ['none'],
  ['crack', 'coating-loss'],
];

fs.mkdirSync(folder, { recursive: true });
for (let index = 0; index < count; index += 1) {
  const file = path.join(folder, `demo-still-${String(index + 1).padStart(3, '0')}.jpg`);
  fs.writeFileSync(
    file,
    await rasteriseSvg(
      borescopeScene(1000 + index, randomMarks(1000 + index, marks[index % marks.length]!)),
    ),
  );
}
console.log(`wrote ${count} invented stills to ${folder}`);
