/** The technicians' week (hours planned against available, reassign from it): props documented in the component's file. */
export {
  TechnicianLoadView,
  type TechnicianLoadViewProps,
} from './components/technician-load-view';
