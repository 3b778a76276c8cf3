/**
 * The photos of a visit: thumbnails, each opening the full-size photo, and (when `canAdd`) a big
 * control that opens the phone's camera to add one.
 */
export interface VisitPhotosProps {
  visitId: string;
  /** The bank the photos added here are of (shown and sent with each new photo). */
  bankId?: string;
  /** The person may add photos (an assigned technician of the visit, or an admin). */
  canAdd: boolean;
}

export function VisitPhotos({ visitId }: VisitPhotosProps) {
  return <section aria-label="Photos" data-visit-id={visitId} />;
}
