/** `npm run bench`: the performance figures the README quotes. Not a test: it measures and prints. */
import { runDecodeBench } from './decode-bench';

const log = (line: string) => console.log(`  ${line}`);
console.log('Fanlight benchmarks (this machine: Node ' + process.version + ')');
console.log('decode (workers/io):');
const decode = await runDecodeBench(log);
const targets = [
  `37 MB WAV under 0.3 s: ${decode.smallBestS < 0.3 ? 'met' : 'NOT met'}`,
  ...(decode.bigPeakRatio !== undefined ? [`2 GB WAV peak memory under 2.5× decoded: ${decode.bigPeakRatio < 2.5 ? 'met' : 'NOT met'}`] : []),
];
for (const t of targets) log(t);
