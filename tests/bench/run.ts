/** `npm run bench`: the performance figures the README quotes. Not a test: it measures and prints. */
import { runApiLoadBench } from './api-load-bench';
import { runBatchMapBench } from './batch-map-bench';
import { runBrowserBench } from './browser-bench';
import { runBigRecordingBench } from './big-recording-bench';
import { runCampaignBench } from './campaign-bench';
import { runCompareBench } from './compare-bench';
import { runDecodeBench } from './decode-bench';
import { runExtractBench } from './extract-bench';
import { runHearingModelBench } from './hearing-model-bench';
import { runInverterBench } from './inverter-bench';
import { runMapBench } from './map-bench';
import { runPlaybackBench } from './playback-bench';

const log = (line: string) => console.log(`  ${line}`);
console.log('Fanlight benchmarks (this machine: Node ' + process.version + ')');
console.log('decode (workers/io):');
const decode = await runDecodeBench(log);
const targets = [
  `37 MB WAV under 0.3 s: ${decode.smallBestS < 0.3 ? 'met' : 'NOT met'}`,
  ...(decode.bigPeakRatio !== undefined ? [`2 GB WAV peak memory under 2.5× decoded: ${decode.bigPeakRatio < 2.5 ? 'met' : 'NOT met'}`] : []),
];
console.log('maps (workers/dsp, worker threads):');
const map = await runMapBench(log);
if (map.scipyRfft60S !== undefined) {
  targets.push(`60 s map at least 2× faster than scipy's batched rfft: ${map.scipyRfft60S / map.fanlight60S >= 2 ? 'met' : 'NOT met'} (${(map.scipyRfft60S / map.fanlight60S).toFixed(2)}×)`);
}
console.log('batch map against a scipy script (whole processes):');
const batchMap = runBatchMapBench(log);
if (batchMap.scipyS !== undefined) {
  const ratio = batchMap.scipyS / batchMap.npmS;
  targets.push(`batch map whole process at least 2× faster than the scipy script: ${ratio >= 2 ? 'met' : 'NOT met'} (${ratio.toFixed(2)}×)`);
} else targets.push('batch map whole process at least 2× faster than the scipy script: not measured (no scipy here)');
console.log('inverter findings (batch CLI):');
const inverter = runInverterBench(log);
targets.push(`inverter command on 20 s under 3 s: ${inverter.bestS < 3 ? 'met' : 'NOT met'}`);
console.log('comparing runs (batch CLI):');
const compare = runCompareBench(log);
targets.push(`compare of two 20 s run-ups under 6 s: ${compare.bestS < 6 ? 'met' : 'NOT met'}`);
console.log('Vold-Kalman extraction (batch CLI):');
const extract = runExtractBench(log);
targets.push(`extract on 20 s, 3 components under 5 s: ${extract.bestS < 5 ? 'met' : 'NOT met'}`);
console.log('campaigns (batch CLI, embedded and over a Redis queue):');
await runCampaignBench(log);
console.log('listening: Vold-Kalman playback blocks (workers/dsp):');
const playback = runPlaybackBench(log);
targets.push(`first playback block under 0.5 s: ${playback.firstBlockS < 0.5 ? 'met' : 'NOT met'}`);
targets.push(`playback processing above 1.5× real time: ${playback.realTimeFactor > 1.5 ? 'met' : 'NOT met'} (${playback.realTimeFactor.toFixed(1)}×)`);
console.log('hearing-model tonality, ECMA-418-2 (workers/dsp):');
const hearing = runHearingModelBench(log);
targets.push(`tonality of 20 s at 51.2 kHz under 20 s: ${hearing.bestS < 20 ? 'met' : 'NOT met'}`);
console.log('the Bench (headless Chromium):');
const bench = await runBrowserBench(log);
if (bench) {
  targets.push(`drop to painted map under 1.5 s: ${Math.min(...bench.dropToPaintedMs) < 1500 ? 'met' : 'NOT met'}`);
  targets.push(`redraw under 16 ms: ${bench.redrawMs.p95 < 16 ? 'met' : 'NOT met'} (95th percentile)`);
}
console.log('a long, wide recording on the Bench (headless Chromium):');
const big = await runBigRecordingBench(log);
targets.push(`4 GB, 32 channels: first map columns within 2 s: ${big.firstColumnsMs < 2000 ? 'met' : 'NOT met'}`);
targets.push(`4 GB, 32 channels: whole map within 10 s: ${big.wholeMapMs < 10_000 ? 'met' : 'NOT met'}`);
targets.push(`4 GB, 32 channels: Chromium under 2.5 GB: ${big.peakChromiumGb < 2.5 ? 'met' : 'NOT met'}`);
console.log('the project store under load (API in its own process, loopback):');
const load = await runApiLoadBench(log);
for (const run of load) {
  if (run.clients >= 200) {
    targets.push(`200 clients: 1000 requests/s and p99 under 300 ms: ${run.perSecond >= 1000 && run.p99Ms < 300 ? 'met' : 'NOT met'}`);
  } else if (run.clients === 20) {
    targets.push(`20 clients: p99 under 50 ms: ${run.p99Ms < 50 ? 'met' : 'NOT met'}`);
  }
  targets.push(`${run.clients} clients: no acknowledged create lost: ${run.writesMissing === 0 ? 'met' : 'NOT met'}`);
}
for (const t of targets) log(t);
