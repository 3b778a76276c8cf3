import type { BankEngineInputs, DecaySample } from '../../../../../../shared/domain';

/** Props of {@link LoggerUpload}. */
export interface LoggerUploadProps {
  /** The bank's design, baseline and cabinet, to judge the file's readings with (bankEngineInputs). */
  engine: BankEngineInputs;
  /** The person chose to use the file's readings: the samples as read, and the file's name. */
  onUse: (samples: DecaySample[], file: { fileName: string }) => void;
}

/**
 * A logger or oscilloscope file as the readings of a decay run: pick a file, see it sent, choose
 * the columns when the file's names do not tell, then a preview (the chart with the live fit and
 * the left-out readings, a one-line verdict) and "Use these readings".
 */
export function LoggerUpload(_props: LoggerUploadProps) {
  return <div data-testid="logger-upload" />;
}
