/** Plan a shutdown window in one step: the dialog the Planner opens (props documented in the component's file). */
export { PlanWindowDialog, type PlanWindowDialogProps } from './components/plan-window-dialog';
