import { createPortal } from 'react-dom';
import type { Cabinet, CabinetLabel } from '../../../../../shared/schemas/cabinet';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { formatVolts } from '../../../lib/units';
import { cabinetsApi, useCabinetLabel } from '../api/cabinets';
import { RecordHeader, RecordLoading } from './record-parts';

// The label prints alone, at its own size: everything but the print copy is hidden.
const PRINT_CSS = `
.ebbline-label-print { display: none; }
@media print {
  @page { size: 100mm 62mm; margin: 0; }
  body > *:not(.ebbline-label-print) { display: none !important; }
  .ebbline-label-print { display: block; }
  html, body { background: #fff !important; margin: 0; }
}
`;

/** The label itself, 100 × 62 mm: tag, place, drive, the marked wait, and the QR code of the cabinet's page. */
function LabelCard({ cabinet: c, label }: { cabinet: Cabinet; label: CabinetLabel }) {
  const qr = `data:image/svg+xml;charset=utf-8,${encodeURIComponent(label.qrSvg)}`;
  return (
    <div
      className="flex overflow-hidden bg-white text-black"
      style={{ width: '100mm', height: '62mm', padding: '4mm', boxSizing: 'border-box', fontFamily: 'Noto Sans, system-ui, sans-serif' }}
      data-testid="cabinet-label"
    >
      <div className="flex min-w-0 flex-1 flex-col" style={{ paddingRight: '3mm' }}>
        <p style={{ fontSize: '2.6mm', letterSpacing: '0.06em' }} className="font-bold uppercase">
          Ebbline · DC-link register
        </p>
        <p className="break-all font-mono font-bold leading-tight" style={{ fontSize: c.tag.length > 16 ? '5mm' : '6.2mm', marginTop: '1.5mm' }}>
          {c.tag}
        </p>
        <p style={{ fontSize: '3mm', marginTop: '1mm' }}>
          {c.siteName} · {c.areaName}
        </p>
        <p style={{ fontSize: '3mm' }}>
          {[c.driveMake, c.driveModel].filter(Boolean).join(' ')} · {formatVolts(c.supplyVolts)}
          {c.dcBusVolts ? ` · DC ${formatVolts(c.dcBusVolts)}` : ''}
        </p>
        <div className="mt-auto" style={{ border: '0.5mm solid #000', padding: '1.2mm 1.5mm', fontSize: '2.7mm', lineHeight: 1.25 }}>
          <p className="font-bold">⚠ Stored energy in the DC link</p>
          <p>
            Qualified persons only. Lock out and tag out.{' '}
            {c.markedWaitMinutes !== null
              ? `Wait at least ${c.markedWaitMinutes} min after isolation (maker's marking),`
              : "Wait at least the maker's marked time after isolation,"}{' '}
            then verify absence of voltage with a rated meter. Local codes apply.
          </p>
        </div>
      </div>
      <div className="flex shrink-0 flex-col items-center justify-center" style={{ width: '30mm' }}>
        <img src={qr} alt={`QR code opening ${c.tag} in Ebbline`} style={{ width: '28mm', height: '28mm' }} data-testid="label-qr" />
        <p className="text-center" style={{ fontSize: '2.3mm', marginTop: '1mm' }}>
          Scan to open in Ebbline
        </p>
      </div>
    </div>
  );
}

/** The printable label of a cabinet, with a preview at its real size. */
export function CabinetLabelScreen({ cabinetId }: { cabinetId: string }) {
  const cabinet = cabinetsApi.useDetail(cabinetId);
  const label = useCabinetLabel(cabinetId);
  if (!cabinet.data) return <RecordLoading query={cabinet} what="cabinet" />;
  if (!label.data) return <RecordLoading query={label} what="label" />;
  return (
    <div className="space-y-5">
      <style>{PRINT_CSS}</style>
      <RecordHeader
        back={{ to: `/register/cabinets/${cabinetId}`, label: cabinet.data.tag }}
        kind="Label"
        title={`Label for ${cabinet.data.tag}`}
        actions={
          <Button variant="primary" onClick={() => window.print()}>
            Print label
          </Button>
        }
      />
      <Card title="Preview (100 × 62 mm)">
        <div className="overflow-x-auto">
          <div className="inline-block rounded-md shadow-[0_0_0_1px_rgba(15,42,51,0.25),0_8px_24px_rgba(15,42,51,0.12)]">
            <LabelCard cabinet={cabinet.data} label={label.data} />
          </div>
        </div>
        <p className="mt-4 text-sm text-tide-800">
          The code opens <a className="break-all font-medium text-tide-600 underline" href={label.data.url} data-testid="label-url">{label.data.url}</a>.
          Print on a 100 × 62 mm label (or at 100 % scale on plain paper and cut out), and stick it inside the cabinet door
          where it stays readable.
        </p>
      </Card>
      {createPortal(
        <div className="ebbline-label-print">
          <LabelCard cabinet={cabinet.data} label={label.data} />
        </div>,
        document.body,
      )}
    </div>
  );
}
