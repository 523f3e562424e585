/** wavefile's WaveFile class: the package ships a UMD bundle that node sees only as its default. */
import * as wavefile from 'wavefile';

export const WaveFile: typeof wavefile.WaveFile =
	(wavefile as unknown as { WaveFile?: typeof wavefile.WaveFile }).WaveFile ??
	(wavefile as unknown as { default: typeof wavefile }).default.WaveFile;
export type WaveFile = InstanceType<typeof WaveFile>;
