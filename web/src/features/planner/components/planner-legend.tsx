import { VISIT_STATES } from '../api/shapes';
import { VISIT_STATE_STYLES, WINDOW_STYLE } from '../utils/calendar-events';

/** What the calendar's colours mean: each visit state, and the shutdown windows behind them. */
export function PlannerLegend({ monthTint = false }: { monthTint?: boolean }) {
  return (
    <ul aria-label="Legend" className="flex flex-wrap gap-x-4 gap-y-1.5 text-xs text-tide-800">
      {VISIT_STATES.map((state) => {
        const style = VISIT_STATE_STYLES[state];
        return (
          <li key={state} className="flex items-center gap-1.5">
            <span aria-hidden="true" className="inline-block h-3.5 w-5 rounded border" style={{ background: style.background, borderColor: style.border }} />
            {style.label}
          </li>
        );
      })}
      <li className="flex items-center gap-1.5">
        <span
          aria-hidden="true"
          className="inline-block h-3.5 w-5 rounded border border-dashed"
          style={{ background: `repeating-linear-gradient(135deg, ${WINDOW_STYLE.background} 0 4px, #e4f1f1 4px 8px)`, borderColor: WINDOW_STYLE.border }}
        />
        {monthTint ? 'day with a shutdown window' : WINDOW_STYLE.label}
      </li>
    </ul>
  );
}
