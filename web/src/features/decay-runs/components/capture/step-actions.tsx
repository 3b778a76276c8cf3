import type { ReactNode } from 'react';
import { Button } from '../../../../components/ui/button';

/** One button of a capture step. */
export interface StepAction {
  label: ReactNode;
  onClick: () => void;
  disabled?: boolean;
}

/**
 * The buttons that end a capture step, big enough for a gloved thumb: the step's own action
 * and, beside it on wider screens, the way back (left out when there is none).
 */
export function StepActions({ next, back }: { next: StepAction; back?: StepAction }) {
  return (
    <div className="flex flex-col gap-2 sm:flex-row">
      <Button
        variant="primary"
        className="min-h-12 w-full text-base sm:w-auto"
        disabled={next.disabled}
        onClick={next.onClick}
      >
        {next.label}
      </Button>
      {back ? (
        <Button className="min-h-12 w-full sm:w-auto" onClick={back.onClick}>
          {back.label}
        </Button>
      ) : null}
    </div>
  );
}
