/**
 * Synthetic dyno runs from an invented engine model with known answers, and run-file text in
 * every format the reader supports. Deterministic for a given seed. Usable by tests, the demo
 * seed and the benches (no Node imports; callers write the text or bytes where they like).
 *
 * The engine model is invented (no real engine): torque is a smooth hump,
 *   T(rpm) = peakTorque · (1 − falloff · ((rpm − peakTorqueRpm) / 1000)²),
 * and power follows from hp = lb·ft × rpm × 2π / 33 000. A run is a steady lead-in at the start
 * rpm, a linear sweep to the end rpm, and a throttle-off deceleration tail.
 *
 * The generator imports nothing from the analysis engine: its constants are written here from
 * NIST SP 811 (2008 ed., Appendix B), so tests check the engine against an independent source.
 */

/** Torque units the generator writes (same spelling as the reader's). */
export type TorqueUnit = 'lbft' | 'nm' | 'kgfm';
/** Power units the generator writes: mechanical hp (550 ft·lbf/s), kW, metric hp (PS). */
export type PowerUnit = 'hp' | 'kw' | 'ps';

/** NIST SP 811: 1 hp (550 ft·lbf/s) = 745.69987 W. */
const W_PER_HP = 745.69987;
/** NIST SP 811: 1 lbf·ft = 1.3558179 N·m. */
const NM_PER_LBFT = 1.3558179;
/** NIST SP 811: 1 PS (metric horsepower, 75 kgf·m/s) = 735.49875 W. */
const W_PER_PS = 735.49875;
/** NIST SP 811: 1 kgf·m = 9.80665 N·m (exact). */
const NM_PER_KGFM = 9.80665;

/** hp from lb·ft at an engine speed: 1 hp = 550 ft·lbf/s = 33 000 ft·lbf/min, one revolution = 2π rad. */
function hpOf(lbft: number, rpm: number): number {
  return (lbft * rpm * 2 * Math.PI) / 33_000;
}
/** A torque in lb·ft written in another unit. */
function lbftTo(v: number, unit: TorqueUnit): number {
  if (unit === 'nm') return v * NM_PER_LBFT;
  if (unit === 'kgfm') return (v * NM_PER_LBFT) / NM_PER_KGFM;
  return v;
}
/** A power in hp written in another unit. */
function hpTo(v: number, unit: PowerUnit): number {
  if (unit === 'kw') return (v * W_PER_HP) / 1000;
  if (unit === 'ps') return (v * W_PER_HP) / W_PER_PS;
  return v;
}

/** The invented engine: a torque hump. */
export interface EngineModel {
  peakTorqueLbft: number;
  peakTorqueRpm: number;
  /** Fractional torque loss per (1000 rpm)² away from the peak. */
  falloff: number;
}

/** A default invented engine, roughly a large air-cooled V-twin at the wheel. */
export const DEFAULT_ENGINE: EngineModel = { peakTorqueLbft: 96, peakTorqueRpm: 3400, falloff: 0.035 };

/** Model torque (lb·ft) at an rpm. */
export function modelTorqueLbft(engine: EngineModel, rpm: number): number {
  const x = (rpm - engine.peakTorqueRpm) / 1000;
  return engine.peakTorqueLbft * (1 - engine.falloff * x * x);
}
/** Model power (hp) at an rpm. */
export function modelPowerHp(engine: EngineModel, rpm: number): number {
  return hpOf(modelTorqueLbft(engine, rpm), rpm);
}

/** Known answers of the model over an rpm range (peaks found by dense 0.5-rpm evaluation). */
export function modelPeaks(engine: EngineModel, fromRpm: number, toRpm: number): { peakPower: { hp: number; rpm: number }; peakTorque: { lbft: number; rpm: number } } {
  let bestP = { hp: -Infinity, rpm: fromRpm };
  let bestT = { lbft: -Infinity, rpm: fromRpm };
  for (let r = fromRpm; r <= toRpm; r += 0.5) {
    const p = modelPowerHp(engine, r);
    const t = modelTorqueLbft(engine, r);
    if (p > bestP.hp) bestP = { hp: p, rpm: r };
    if (t > bestT.lbft) bestT = { lbft: t, rpm: r };
  }
  return { peakPower: bestP, peakTorque: bestT };
}

/** Seeded PRNG (mulberry32) with a Gaussian helper. */
export function createRandom(seed: number): { next: () => number; gaussian: (sd?: number) => number } {
  let a = seed >>> 0;
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const gaussian = (sd = 1) => {
    const u = Math.max(next(), 1e-12);
    const v = next();
    return sd * Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
  };
  return { next, gaussian };
}

/** Options of a synthetic run. */
export interface SyntheticRunOptions {
  seed?: number;
  engine?: Partial<EngineModel>;
  startRpm?: number;
  endRpm?: number;
  /** Sweep rate, rpm per second. */
  sweepRate?: number;
  /** Samples per second (ignored when `totalRows` is given). */
  sampleHz?: number;
  /** Exact number of rows wanted (sets the sample rate). */
  totalRows?: number;
  /** Seconds of steady running at the start rpm before the sweep. */
  leadInSeconds?: number;
  /** Seconds of throttle-off deceleration after the sweep. */
  tailSeconds?: number;
  /** Standard deviation of rpm noise. */
  rpmNoise?: number;
  /** Standard deviation of torque noise, lb·ft. */
  torqueNoise?: number;
  /** Number of AFR channels (front, rear …). */
  afrChannels?: number;
  /** Overall scale applied to torque (e.g. 1.06 for a 6 % gain). */
  gain?: number;
}

/** One sample row, always in lb·ft / hp / mph internally. */
export interface SyntheticSample {
  time: number;
  rpm: number;
  torqueLbft: number;
  powerHp: number;
  speedMph: number;
  afr: number[];
  manifoldKpa: number;
  intakeAirC: number;
}

/** A generated run with its known answers. */
export interface SyntheticRun {
  samples: SyntheticSample[];
  engine: EngineModel;
  /** Indices of the first and last sweep sample, and the model's peaks over the sweep. */
  truth: {
    sweepStart: number;
    sweepEnd: number;
    startRpm: number;
    endRpm: number;
    peakPower: { hp: number; rpm: number };
    peakTorque: { lbft: number; rpm: number };
  };
}

function resolved(o: SyntheticRunOptions) {
  const engine = { ...DEFAULT_ENGINE, ...o.engine };
  const startRpm = o.startRpm ?? 2000;
  const endRpm = o.endRpm ?? 5800;
  const sweepRate = o.sweepRate ?? 500;
  const leadIn = o.leadInSeconds ?? 2;
  const tail = o.tailSeconds ?? 1.5;
  const sweepSeconds = (endRpm - startRpm) / sweepRate;
  const totalSeconds = leadIn + sweepSeconds + tail;
  const sampleHz = o.totalRows ? o.totalRows / totalSeconds : (o.sampleHz ?? 20);
  const totalRows = o.totalRows ?? Math.round(totalSeconds * sampleHz);
  return {
    seed: o.seed ?? 1,
    engine,
    startRpm,
    endRpm,
    sweepRate,
    leadIn,
    tail,
    sweepSeconds,
    sampleHz,
    totalRows,
    rpmNoise: o.rpmNoise ?? 4,
    torqueNoise: o.torqueNoise ?? 0.25,
    afrChannels: o.afrChannels ?? 2,
    gain: o.gain ?? 1,
  };
}

/**
 * Samples of a run, generated one at a time (so very large files need no big arrays). The
 * sample count is known in advance: `syntheticRowCount(options)`.
 */
export function* syntheticSamples(options: SyntheticRunOptions = {}): Generator<SyntheticSample> {
  const o = resolved(options);
  const rnd = createRandom(o.seed);
  for (let i = 0; i < o.totalRows; i++) {
    const t = i / o.sampleHz;
    let rpm: number;
    let throttle = true;
    if (t < o.leadIn) rpm = o.startRpm;
    else if (t < o.leadIn + o.sweepSeconds) rpm = o.startRpm + (t - o.leadIn) * o.sweepRate;
    else {
      rpm = Math.max(1000, o.endRpm - (t - o.leadIn - o.sweepSeconds) * o.sweepRate * 2);
      throttle = false;
    }
    const noisyRpm = rpm + rnd.gaussian(o.rpmNoise);
    const torque = throttle
      ? (t < o.leadIn ? 0.35 : 1) * o.gain * modelTorqueLbft(o.engine, rpm) + rnd.gaussian(o.torqueNoise)
      : -4 + rnd.gaussian(o.torqueNoise);
    const afr = Array.from({ length: o.afrChannels }, (_, k) => (throttle ? 13.1 + 0.2 * k : 15.5) + rnd.gaussian(0.05));
    yield {
      time: t,
      rpm: noisyRpm,
      torqueLbft: torque,
      powerHp: hpOf(torque, noisyRpm),
      speedMph: noisyRpm / 46,
      afr,
      manifoldKpa: throttle ? 98 : 30,
      intakeAirC: 28 + 0.001 * i,
    };
  }
}

/** Number of samples `syntheticSamples(options)` yields. */
export function syntheticRowCount(options: SyntheticRunOptions = {}): number {
  return resolved(options).totalRows;
}

/** Generates a whole run with known answers. */
export function syntheticRun(options: SyntheticRunOptions = {}): SyntheticRun {
  const o = resolved(options);
  const samples = [...syntheticSamples(options)];
  const sweepStart = Math.ceil(o.leadIn * o.sampleHz);
  const sweepEnd = Math.min(samples.length - 1, Math.floor((o.leadIn + o.sweepSeconds) * o.sampleHz));
  const scaled = { ...o.engine, peakTorqueLbft: o.engine.peakTorqueLbft * o.gain };
  return { samples, engine: scaled, truth: { sweepStart, sweepEnd, startRpm: o.startRpm, endRpm: o.endRpm, ...modelPeaks(scaled, o.startRpm, o.endRpm) } };
}

/** Columns a file may carry. */
export type SyntheticColumn = 'time' | 'rpm' | 'torque' | 'power' | 'speed' | 'afr' | 'lambda' | 'map' | 'iat';

/** How a run is written to a file. */
export interface RunFileFormat {
  delimiter?: ',' | ';' | '\t' | '|';
  /** Decimal comma (only sensible with a delimiter other than comma). */
  decimalComma?: boolean;
  lineEnding?: '\n' | '\r\n' | '\r';
  encoding?: 'utf-8' | 'utf-8-bom' | 'utf-16le' | 'utf-16be' | 'latin1';
  /** Header style: units in brackets, in parentheses, abbreviated names, a units-only second row, or no header. */
  headerStyle?: 'brackets' | 'parentheses' | 'abbreviated' | 'units-row' | 'none';
  torqueUnit?: TorqueUnit;
  powerUnit?: PowerUnit;
  /** Columns in order (default time, rpm, torque, power, afr). */
  columns?: SyntheticColumn[];
  /** Preamble style. */
  preamble?: 'colon' | 'delimited' | 'none';
  conditions?: { temperatureC?: number; baroKpa?: number; humidityPct?: number; date?: string; operator?: string; notes?: string };
  /** Write numbers ≥ 1000 as quoted thousands ("5,012"); comma delimiter only. */
  quoteThousands?: boolean;
  /** Decimals written for torque and power. */
  decimals?: number;
  /** Label the torque/power columns with these units while writing the values in `torqueUnit`/`powerUnit` (simulates a mix-up). */
  labelTorqueUnit?: TorqueUnit;
  labelPowerUnit?: PowerUnit;
  /** Header language for time, engine speed, torque and power (default English). */
  headerLanguage?: HeaderLanguage;
  /** Engine speed written in thousands (3 decimals): labelled `x1000 rpm`, or with no unit at all. */
  rpmThousands?: 'labelled' | 'unlabelled';
  /** Road speed unit of the `speed` column (default mph). */
  speedUnit?: 'mph' | 'kmh';
  /** Text after the data table: a summary block, free notes, or a second (summary) table. */
  footer?: 'summary' | 'notes' | 'second-table';
}

/** Languages of {@link RunFileFormat.headerLanguage}. */
export type HeaderLanguage = 'en' | 'de' | 'fr' | 'it' | 'es' | 'nl';

/** Time, engine speed (with its unit), torque and power names per language (invented wording, as dyno PCs in those languages label them). */
const HEADER_NAMES: Record<Exclude<HeaderLanguage, 'en'>, { time: string; rpm: string; rpmUnit: string; torque: string; power: string }> = {
  de: { time: 'Zeit', rpm: 'Drehzahl', rpmUnit: '1/min', torque: 'Drehmoment', power: 'Leistung' },
  fr: { time: 'Temps', rpm: 'Régime moteur', rpmUnit: 'tr/min', torque: 'Couple', power: 'Puissance' },
  it: { time: 'Tempo', rpm: 'Regime', rpmUnit: 'giri/min', torque: 'Coppia', power: 'Potenza' },
  es: { time: 'Tiempo', rpm: 'Régimen', rpmUnit: 'rpm', torque: 'Par motor', power: 'Potencia' },
  nl: { time: 'Tijd', rpm: 'Toerental', rpmUnit: 'omw/min', torque: 'Koppel', power: 'Vermogen' },
};

/** NIST SP 811 (2008), Appendix B: 1 mile = 1609.344 m exactly, so 1 mph = 1.609344 km/h. */
const KMH_PER_MPH = 1.609344;

const UNIT_LABEL: Record<string, Record<string, string>> = {
  brackets: { lbft: 'lb-ft', nm: 'Nm', kgfm: 'kgm', hp: 'hp', kw: 'kW', ps: 'PS' },
  parentheses: { lbft: 'ft-lb', nm: 'N·m', kgfm: 'kgf·m', hp: 'hp', kw: 'kW', ps: 'PS' },
  abbreviated: { lbft: 'ftlb', nm: 'nm', kgfm: 'kgm', hp: 'hp', kw: 'kw', ps: 'ps' },
};

function headerCells(columns: SyntheticColumn[], f: Required<Pick<RunFileFormat, 'headerStyle'>> & RunFileFormat, afrChannels: number): { names: string[]; units: string[] } {
  const tu = f.labelTorqueUnit ?? f.torqueUnit ?? 'lbft';
  const pu = f.labelPowerUnit ?? f.powerUnit ?? 'hp';
  const style = f.headerStyle === 'units-row' || f.headerStyle === 'none' ? 'brackets' : f.headerStyle;
  const L = UNIT_LABEL[style];
  const names: string[] = [];
  const units: string[] = [];
  const side = ['Front', 'Rear', 'Third', 'Fourth'];
  const lang = f.headerLanguage && f.headerLanguage !== 'en' ? HEADER_NAMES[f.headerLanguage] : null;
  for (const c of columns) {
    const push = (name: string, unit: string, abbr: string) => {
      if (f.rpmThousands && c === 'rpm') {
        names.push(f.rpmThousands === 'labelled' ? `${name} [x1000 rpm]` : name);
        units.push('-');
        return;
      }
      if (f.headerStyle === 'abbreviated') names.push(abbr);
      else if (f.headerStyle === 'units-row') names.push(name);
      else names.push(unit ? (style === 'brackets' ? `${name} [${unit}]` : `${name} (${unit})`) : name);
      units.push(unit || '-');
    };
    if (c === 'time') push(lang?.time ?? 'Time', 's', 'time');
    else if (c === 'rpm') push(lang?.rpm ?? (f.headerStyle === 'parentheses' ? 'Engine RPM' : 'Engine Speed'), lang?.rpmUnit ?? 'rpm', 'rpm');
    else if (c === 'torque') push(lang?.torque ?? 'Torque', L[tu], `tq_${UNIT_LABEL.abbreviated[tu]}`);
    else if (c === 'power') push(lang?.power ?? 'Power', L[pu], UNIT_LABEL.abbreviated[pu]);
    else if (c === 'speed') push('Road Speed', f.speedUnit === 'kmh' ? 'km/h' : 'mph', f.speedUnit === 'kmh' ? 'kmh' : 'mph');
    else if (c === 'map') push('MAP', 'kPa', 'map_kpa');
    else if (c === 'iat') push('IAT', '°C', 'iat');
    else if (c === 'afr') for (let k = 0; k < afrChannels; k++) push(`AFR ${side[k] ?? k + 1}`, 'AFR', `afr${k + 1}`);
    else if (c === 'lambda') for (let k = 0; k < afrChannels; k++) push(`Lambda ${side[k] ?? k + 1}`, 'λ', `lambda${k + 1}`);
  }
  return { names, units };
}

function formatNumber(v: number, decimals: number, f: RunFileFormat): string {
  let s = v.toFixed(decimals);
  if (f.quoteThousands && Math.abs(v) >= 1000) {
    const [int, frac] = s.split('.');
    s = `"${int.replace(/\B(?=(\d{3})+(?!\d))/g, ',')}${frac ? `.${frac}` : ''}"`;
  }
  if (f.decimalComma) s = s.replace('.', ',');
  return s;
}

function preambleLines(f: RunFileFormat): string[] {
  const c = f.conditions ?? {};
  if (!f.preamble || f.preamble === 'none') return [];
  const d = f.delimiter ?? ',';
  const num = (v: number) => (f.decimalComma ? String(v).replace('.', ',') : String(v));
  const entries: [string, string, string][] = [];
  entries.push(['Pullbook synthetic run', '', '']);
  if (c.date) entries.push(['Date', c.date, '']);
  if (c.operator) entries.push(['Operator', c.operator, '']);
  if (c.temperatureC !== undefined) entries.push(['Ambient temperature', num(c.temperatureC), '°C']);
  if (c.baroKpa !== undefined) entries.push(['Barometric pressure', num(c.baroKpa), 'kPa']);
  if (c.humidityPct !== undefined) entries.push(['Relative humidity', num(c.humidityPct), '%']);
  if (c.notes) entries.push(['Notes', c.notes, '']);
  return entries.map(([k, v, u]) => {
    if (!v) return k;
    if (f.preamble === 'colon') return `${k}: ${v}${u ? ` ${u}` : ''}`;
    return [k, v, u].filter(Boolean).join(d);
  });
}

/** Header and preamble lines of a file (everything before the data rows). */
export function renderFileHead(format: RunFileFormat = {}, afrChannels = 2): string[] {
  const f = { headerStyle: 'brackets' as const, ...format };
  const d = f.delimiter ?? ',';
  const columns = f.columns ?? ['time', 'rpm', 'torque', 'power', 'afr'];
  const lines = preambleLines(f);
  if (f.headerStyle !== 'none') {
    const { names, units } = headerCells(columns, f, afrChannels);
    lines.push(names.join(d));
    if (f.headerStyle === 'units-row') lines.push(units.join(d));
  }
  return lines;
}

/** One data row as text. */
export function renderSample(s: SyntheticSample, format: RunFileFormat = {}): string {
  const d = format.delimiter ?? ',';
  const columns = format.columns ?? ['time', 'rpm', 'torque', 'power', 'afr'];
  const dec = format.decimals ?? 2;
  const tu = format.torqueUnit ?? 'lbft';
  const pu = format.powerUnit ?? 'hp';
  const out: string[] = [];
  for (const c of columns) {
    if (c === 'time') out.push(formatNumber(s.time, 3, format));
    else if (c === 'rpm') out.push(format.rpmThousands ? formatNumber(s.rpm / 1000, 3, format) : formatNumber(s.rpm, 0, format));
    else if (c === 'torque') out.push(formatNumber(lbftTo(s.torqueLbft, tu), dec, format));
    else if (c === 'power') out.push(formatNumber(hpTo(s.powerHp, pu), dec, format));
    else if (c === 'speed') out.push(formatNumber(format.speedUnit === 'kmh' ? s.speedMph * KMH_PER_MPH : s.speedMph, 1, format));
    else if (c === 'map') out.push(formatNumber(s.manifoldKpa, 1, format));
    else if (c === 'iat') out.push(formatNumber(s.intakeAirC, 1, format));
    else if (c === 'afr') for (const a of s.afr) out.push(formatNumber(a, 2, format));
    else if (c === 'lambda') for (const a of s.afr) out.push(formatNumber(a / 14.7, 3, format));
  }
  return out.join(d);
}

/** Encodes text in one of the supported encodings. */
export function encodeText(text: string, encoding: RunFileFormat['encoding'] = 'utf-8'): Uint8Array {
  if (encoding === 'utf-8') return new TextEncoder().encode(text);
  if (encoding === 'utf-8-bom') {
    const body = new TextEncoder().encode(text);
    const out = new Uint8Array(body.length + 3);
    out.set([0xef, 0xbb, 0xbf]);
    out.set(body, 3);
    return out;
  }
  if (encoding === 'latin1') return Uint8Array.from(text, (ch) => (ch.charCodeAt(0) < 256 ? ch.charCodeAt(0) : 0x3f));
  const out = new Uint8Array(2 + text.length * 2);
  const le = encoding === 'utf-16le';
  out[0] = le ? 0xff : 0xfe;
  out[1] = le ? 0xfe : 0xff;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    out[2 + 2 * i] = le ? c & 0xff : c >> 8;
    out[3 + 2 * i] = le ? c >> 8 : c & 0xff;
  }
  return out;
}

/** Renders a run as a complete file: text and encoded bytes. */
export function renderRunFile(run: SyntheticRun, format: RunFileFormat = {}): { text: string; bytes: Uint8Array } {
  const eol = format.lineEnding ?? '\n';
  const lines = renderFileHead(format, run.samples[0]?.afr.length ?? 0);
  for (const s of run.samples) lines.push(renderSample(s, format));
  lines.push(...footerLines(run, format));
  const text = lines.join(eol) + eol;
  return { text, bytes: encodeText(text, format.encoding) };
}

/** Lines after the data table (see {@link RunFileFormat.footer}). */
export function footerLines(run: SyntheticRun, format: RunFileFormat): string[] {
  const d = format.delimiter ?? ',';
  const num = (v: number, dec: number) => formatNumber(v, dec, format);
  const { peakPower, peakTorque } = run.truth;
  if (format.footer === 'summary') {
    return ['', ['Summary'].join(d), ['Max power', num(peakPower.hp, 1), 'hp', '@', num(peakPower.rpm, 0), 'rpm'].join(d), ['Max torque', num(peakTorque.lbft, 1), 'lb-ft', '@', num(peakTorque.rpm, 0), 'rpm'].join(d)];
  }
  if (format.footer === 'notes') return ['', 'Notes: second pull after cooling; fan on; tyre pressure checked.', 'Operator initials: DK'];
  if (format.footer === 'second-table') {
    return ['', ['Band', 'Avg Power [hp]', 'Avg Torque [lb-ft]'].join(d), ...[3000, 4000, 5000].map((r) => [`${r}-${r + 1000}`, num(modelPowerHp(run.engine, r + 500), 1), num(modelTorqueLbft(run.engine, r + 500), 1)].join(d))];
  }
  return [];
}

/** Convenience: generate a run and render it in one call. */
export function syntheticRunFile(options: SyntheticRunOptions = {}, format: RunFileFormat = {}): { run: SyntheticRun; text: string; bytes: Uint8Array } {
  const run = syntheticRun(options);
  return { run, ...renderRunFile(run, format) };
}

/**
 * Text chunks of a large file of about `targetBytes` (UTF-8, ASCII only), produced lazily for
 * benches and stress tests: a long, densely sampled run in the default bracket format.
 */
export function* largeRunFileChunks(targetBytes: number, options: SyntheticRunOptions = {}, format: RunFileFormat = {}): Generator<string> {
  const eol = format.lineEnding ?? '\n';
  const probe = [...syntheticSamples({ ...options, totalRows: 200 })].map((s) => renderSample(s, format).length + eol.length);
  const bytesPerRow = probe.reduce((a, b) => a + b, 0) / probe.length;
  const totalRows = Math.max(10, Math.floor(targetBytes / bytesPerRow));
  yield renderFileHead(format, options.afrChannels ?? 2).join(eol) + eol;
  let buf: string[] = [];
  for (const s of syntheticSamples({ ...options, totalRows })) {
    buf.push(renderSample(s, format));
    if (buf.length === 5000) {
      yield buf.join(eol) + eol;
      buf = [];
    }
  }
  if (buf.length) yield buf.join(eol) + eol;
}

/** A sensor fault written into a run: what an engine-speed pickup does when it misbehaves. */
export interface SyntheticGlitch {
  /** Index of the first affected sample. */
  at: number;
  /** Drop-out to zero, a doubled or halved reading, or a single wild spike (+60 %). */
  kind: 'dropout' | 'double' | 'half' | 'spike';
  /** Consecutive samples affected (default 1). */
  length?: number;
  /** The dyno's torque reading spikes at the same time (×1.8), as a drum-acceleration torque does. */
  torqueSpike?: boolean;
}

const GLITCH_FACTOR: Record<SyntheticGlitch['kind'], number> = { dropout: 0, double: 2, half: 0.5, spike: 1.6 };

/**
 * Writes pickup faults into a run's samples (a copy): the logged engine speed is wrong, and the
 * logged power is what a dyno computes from that wrong speed (hp = lb·ft × rpm × 2π / 33 000), so a
 * doubled reading doubles the logged power. `truth` is unchanged: the noise-free model.
 */
export function withGlitches(run: SyntheticRun, glitches: SyntheticGlitch[]): SyntheticRun {
  const samples = run.samples.map((s) => ({ ...s, afr: [...s.afr] }));
  for (const g of glitches) {
    for (let i = g.at; i < Math.min(samples.length, g.at + (g.length ?? 1)); i++) {
      const s = samples[i];
      s.rpm *= GLITCH_FACTOR[g.kind];
      if (g.torqueSpike) s.torqueLbft *= 1.8;
      s.powerHp = hpOf(s.torqueLbft, s.rpm);
      s.speedMph = s.rpm / 46;
    }
  }
  return { ...run, samples };
}

/** One wide-open-throttle pull of a multi-pull log. */
export interface SyntheticPull {
  startRpm: number;
  endRpm: number;
}

/** Options of a continuous log holding several pulls. */
export interface SyntheticLogOptions {
  seed?: number;
  engine?: Partial<EngineModel>;
  pulls: SyntheticPull[];
  /** rpm per second while sweeping (coast-downs fall at twice this rate). */
  sweepRate?: number;
  sampleHz?: number;
  /** Seconds held at part throttle (35 % load) at a pull's start rpm before it. */
  leadInSeconds?: number;
  /** Between pulls: coast down to idle and idle this long, then rise at part throttle to the next start. 0 = coast down to the next start rpm only. */
  idleSeconds?: number;
  idleRpm?: number;
  rpmNoise?: number;
  torqueNoise?: number;
  afrChannels?: number;
}

/** A multi-pull log with the model's peaks per pull. */
export interface SyntheticLog extends SyntheticRun {
  pulls: { startRpm: number; endRpm: number; sweepStart: number; sweepEnd: number; peakPower: { hp: number; rpm: number }; peakTorque: { lbft: number; rpm: number } }[];
}

/**
 * A continuous log with several pulls separated by coast-downs (throttle off, torque −4 lb·ft,
 * rpm falling at twice the sweep rate) and optionally idling. `truth` describes the pull with the
 * largest rpm rise (the main one); `pulls` every pull in time order.
 */
export function syntheticLog(options: SyntheticLogOptions): SyntheticLog {
  const engine = { ...DEFAULT_ENGINE, ...options.engine };
  const rate = options.sweepRate ?? 500;
  const hz = options.sampleHz ?? 20;
  const leadIn = options.leadInSeconds ?? 1.5;
  const idleSeconds = options.idleSeconds ?? 0;
  const idleRpm = options.idleRpm ?? 1100;
  const rnd = createRandom(options.seed ?? 1);
  const rpmNoise = options.rpmNoise ?? 4;
  const torqueNoise = options.torqueNoise ?? 0.25;
  const afrChannels = options.afrChannels ?? 2;
  // Phases: [seconds, rpm at start, rpm at end, load: 'wot' | 'part' | 'coast' | 'idle'].
  type Load = 'wot' | 'part' | 'coast' | 'idle';
  const phases: [number, number, number, Load][] = [];
  options.pulls.forEach((p, k) => {
    const next = options.pulls[k + 1];
    phases.push([leadIn, p.startRpm, p.startRpm, 'part']);
    phases.push([(p.endRpm - p.startRpm) / rate, p.startRpm, p.endRpm, 'wot']);
    const floor = next ? (idleSeconds > 0 ? idleRpm : next.startRpm) : Math.max(1000, p.startRpm - 500);
    phases.push([Math.max(0.5, (p.endRpm - floor) / (2 * rate)), p.endRpm, floor, 'coast']);
    if (next && idleSeconds > 0) {
      phases.push([idleSeconds, idleRpm, idleRpm, 'idle']);
      phases.push([1, idleRpm, next.startRpm, 'part']);
    }
  });
  const samples: SyntheticSample[] = [];
  const pulls: SyntheticLog['pulls'] = [];
  let t0 = 0;
  for (const [seconds, from, to, load] of phases) {
    const count = Math.round(seconds * hz);
    const first = samples.length;
    for (let j = 0; j < count; j++) {
      const t = t0 + j / hz;
      const rpm = from + ((to - from) * j) / count;
      const noisyRpm = rpm + rnd.gaussian(rpmNoise);
      const model = modelTorqueLbft(engine, rpm);
      const torque =
        (load === 'wot' ? model : load === 'part' ? 0.35 * model : load === 'idle' ? 2 : -4) + rnd.gaussian(torqueNoise);
      samples.push({
        time: t,
        rpm: noisyRpm,
        torqueLbft: torque,
        powerHp: hpOf(torque, noisyRpm),
        speedMph: noisyRpm / 46,
        afr: Array.from({ length: afrChannels }, (_, k) => (load === 'wot' ? 13.1 + 0.2 * k : 15.5) + rnd.gaussian(0.05)),
        manifoldKpa: load === 'wot' ? 98 : 30,
        intakeAirC: 28 + 0.001 * samples.length,
      });
    }
    if (load === 'wot') pulls.push({ startRpm: from, endRpm: to, sweepStart: first, sweepEnd: samples.length - 1, ...modelPeaks(engine, from, to) });
    t0 += count / hz;
  }
  let main = pulls[0];
  for (const p of pulls) if (p.endRpm - p.startRpm > main.endRpm - main.startRpm) main = p;
  return { samples, engine, pulls, truth: { sweepStart: main.sweepStart, sweepEnd: main.sweepEnd, startRpm: main.startRpm, endRpm: main.endRpm, peakPower: main.peakPower, peakTorque: main.peakTorque } };
}

/** The usual multi-pull example (invented): two full sweeps and a third aborted at 3,400 rpm, with idling between. */
export function threePullLog(seed: number): SyntheticLog {
  return syntheticLog({
    seed,
    rpmNoise: 2,
    torqueNoise: 0.05,
    pulls: [
      { startRpm: 2000, endRpm: 5800 },
      { startRpm: 2200, endRpm: 6000 },
      { startRpm: 2000, endRpm: 3400 },
    ],
    idleSeconds: 2,
  });
}
