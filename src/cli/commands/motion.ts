import { readFile } from 'node:fs/promises';
import { basename, resolve } from 'node:path';
import { forJson } from './pendulum';
import { analyseMotionRecording, formatAngleTraceCsv, MotionInputError, parseMotionCsv } from '../../lib/sensors/index';
import { optionDecimal, parseOptions, RefusedInput, type CliCommand } from '../command';
import { writeOutputFile } from '../output-file';

const usage = `kinnote motion FILE.csv [--trace OUT.csv] [--start-angle DEG]

Analyses a knee pendulum test recorded with a phone strapped to the shank. FILE.csv holds the phone's
device-motion samples with the header
  time_ms,rate_alpha_dps,rate_beta_dps,rate_gamma_dps,acc_x_ms2,acc_y_ms2,acc_z_ms2
(rotation rate in deg/s and acceleration including gravity in m/s², on the W3C DeviceMotionEvent
axes; the phone may sit on the shank in any orientation). The rotation-rate columns follow the
current W3C Device Orientation and Motion text, as Chrome and Firefox on Android and Safari on iOS
deliver it: rate_alpha_dps is the rate about the phone's x axis, rate_beta_dps about y,
rate_gamma_dps about z. (An older text paired alpha with z, beta with x, gamma with y; a file in
that older order is recognised from its data where possible and analysed with a warning.) The knee angle is reconstructed by fusing
gyroscope and gravity, then analysed as by \`kinnote pendulum\`, whose JSON this prints. The
recording may start minutes before the release: the test is analysed from the held second before
the fall (a lead-in over 10 s is named in the warnings).

  --trace OUT.csv   also write the reconstructed trace as time_s,angle_deg
  --start-angle     knee flexion at which the leg was held before release, when known better than
                    the phone's reading (default: from gravity along the phone's long edge, which
                    must lie along the shin; absolute angles then carry up to ±15° of the phone's
                    tilt on the shank, A0, A1 and R2 do not)

Refused input exits with status 1 and one line on stderr naming file, row and reason.
Not a diagnostic device: the indices support, and never replace, a clinician's judgement.`;

export const motionCommand: CliCommand = {
  name: 'motion',
  summary: 'analyse a pendulum test recorded with a phone (device-motion CSV) like `pendulum`',
  usage,
  async run(args, io) {
    const { positional, values } = parseOptions(args, ['trace', 'start-angle']);
    if (positional.length !== 1) throw new RefusedInput('give one file; usage: kinnote motion FILE.csv [--trace OUT.csv]');
    const name = positional[0] as string;
    const startAngle = optionDecimal(values.get('start-angle'), 'start-angle', -30, 180);
    let text: string;
    try {
      text = await readFile(resolve(io.cwd, name), 'utf8');
    } catch (error) {
      throw new RefusedInput(`${name}: cannot read the file (${(error as NodeJS.ErrnoException).code ?? 'error'})`);
    }
    const fileName = basename(name);
    let result;
    try {
      result = analyseMotionRecording(parseMotionCsv(text, fileName), { fileName, ...(startAngle === undefined ? {} : { startAngleDeg: startAngle }) });
    } catch (error) {
      if (error instanceof MotionInputError) throw new RefusedInput(error.message);
      throw error;
    }
    const tracePath = values.get('trace');
    if (tracePath !== undefined) {
      await writeOutputFile(resolve(io.cwd, tracePath), formatAngleTraceCsv(result.reconstruction.timeS, result.reconstruction.angleDeg), tracePath);
    }
    io.stdout(JSON.stringify(forJson(result.analysis.indices), null, 2));
    return 0;
  },
};
