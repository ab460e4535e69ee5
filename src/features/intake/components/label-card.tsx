import { formatShortCode } from '@shared/block-reference';
import type { LabelDto, LabelSheetDataDto } from '@shared/schemas/intake';

/** One label's content: QR code with the short code under it, then swap, maker and block number. */
export function LabelCard({ label, swap }: { label: LabelDto; swap: LabelSheetDataDto['swap'] }) {
  const code = formatShortCode(label.shortCode);
  return (
    <>
      <div className="label-qr">
        <img src={label.qr} alt={`QR code of block ${label.ordinal} of ${label.of}`} />
        <span className="label-code" aria-label={`Short code ${code.split('').join(' ')}`}>
          {code}
        </span>
      </div>
      <div className="label-text">
        <span className="label-title">{swap.title}</span>
        <span className="label-line">{label.makerName}</span>
        <span className="label-line">
          Block {label.ordinal} of {label.of}
        </span>
        <span className="label-line">{swap.guildName}</span>
      </div>
    </>
  );
}
