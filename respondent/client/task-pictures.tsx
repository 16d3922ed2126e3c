// Small drawings of what each task will show, for the instruction screen: our own inline SVG
// (presentation attributes only, so the respondent pages' strict style policy holds), in the
// palette of tailwind.config.ts. Decorative: the text beside each drawing says the same.
import { fill, type Messages } from '@/respondent/messages/format';
import type { FlowStudy } from '@/respondent/shared/types';

/** The drawings' example prices, written with the study's decimal mark (2.49 or 2,49). */
const amount = (v: number, locale: string) => v.toLocaleString(locale, { minimumFractionDigits: 2, maximumFractionDigits: 2 });

const INK = '#1F2430', MUTED = '#5B6170', RULE = '#E4DED4', TEAL = '#0F6E6E', CARD = '#FFFFFF';

function Tag({ x, y, w = 56, text, covered }: { x: number; y: number; w?: number; text?: string; covered?: boolean }) {
  return (
    <g>
      <rect x={x} y={y} width={w} height={30} rx={2} fill={covered ? RULE : CARD} stroke={INK} strokeWidth={2} />
      <rect x={x} y={y} width={w} height={5} fill={INK} />
      {text ? <text x={x + w / 2} y={y + 24} textAnchor="middle" fontSize={14} fontWeight={600} fill={INK} fontFamily="monospace">{text}</text> : null}
    </g>
  );
}

function Arrow({ x, y }: { x: number; y: number }) {
  return <path d={`M${x} ${y} h22 m-7 -6 l7 6 l-7 6`} fill="none" stroke={MUTED} strokeWidth={2} strokeLinecap="round" strokeLinejoin="round" />;
}

function Answer({ x, y, w, text }: { x: number; y: number; w: number; text: string }) {
  return (
    <g>
      <rect x={x} y={y} width={w} height={22} rx={3} fill={CARD} stroke={TEAL} strokeWidth={2} />
      <text x={x + w / 2} y={y + 15} textAnchor="middle" fontSize={11} fontWeight={600} fill={TEAL}>{text}</text>
    </g>
  );
}

function Store({ x, label }: { x: number; label: string }) {
  return (
    <g>
      <path d={`M${x} 50 l10 -14 h44 l10 14 z`} fill={RULE} stroke={INK} strokeWidth={2} strokeLinejoin="round" />
      <rect x={x + 4} y={50} width={56} height={36} fill={CARD} stroke={INK} strokeWidth={2} />
      <rect x={x + 24} y={64} width={16} height={22} fill={RULE} stroke={INK} strokeWidth={1.5} />
      <text x={x + 32} y={102} textAnchor="middle" fontSize={11} fill={MUTED}>{label}</text>
    </g>
  );
}

/** Remembered shelf → one price → lower or the same? */
function SpotPicture({ m, locale }: { m: Messages; locale: string }) {
  return (
    <>
      <rect x={6} y={10} width={96} height={96} rx={2} fill={CARD} stroke={RULE} strokeWidth={2} />
      {[0, 1, 2].map((i) => (
        <g key={i}>
          <line x1={14} x2={56} y1={30 + i * 28} y2={30 + i * 28} stroke={MUTED} strokeWidth={3} strokeLinecap="round" />
          <text x={94} y={34 + i * 28} textAnchor="end" fontSize={12} fontWeight={600} fill={INK} fontFamily="monospace">{amount([2.49, 5.99, 1.29][i], locale)}</text>
        </g>
      ))}
      <Arrow x={112} y={58} />
      <Tag x={146} y={24} w={64} text="?" />
      <Answer x={226} y={20} w={84} text={m.picture.lower} />
      <Answer x={226} y={52} w={84} text={m.picture.same} />
    </>
  );
}

/** Two tags for a moment → covered → tap the lower one. */
function PickPicture({ m, locale }: { m: Messages; locale: string }) {
  return (
    <>
      <Tag x={6} y={34} text={amount(2.49, locale)} />
      <Tag x={68} y={34} text={amount(2.29, locale)} />
      <text x={66} y={84} textAnchor="middle" fontSize={11} fill={MUTED}>{m.picture.moment}</text>
      <Arrow x={134} y={49} />
      <Tag x={166} y={34} covered />
      <Tag x={228} y={34} covered />
      <circle cx={256} cy={58} r={10} fill="none" stroke={TEAL} strokeWidth={3} />
      <text x={226} y={84} textAnchor="middle" fontSize={11} fill={MUTED}>{m.picture.whichLower}</text>
    </>
  );
}

/** Here at the usual price, or a trip for a lower one? */
function TripPicture({ m, locale, minutes }: { m: Messages; locale: string; minutes: number }) {
  return (
    <>
      <Store x={6} label={m.picture.here} />
      <Tag x={14} y={2} w={48} text={amount(2.49, locale)} />
      <path d="M82 76 H226" stroke={MUTED} strokeWidth={3} strokeDasharray="6 6" strokeLinecap="round" />
      <text x={154} y={66} textAnchor="middle" fontSize={12} fontWeight={600} fill={INK}>{fill(m.picture.minutes, { n: minutes })}</text>
      <Store x={240} label={m.picture.otherStore} />
      <Tag x={248} y={2} w={48} text={amount(2.19, locale)} />
    </>
  );
}

export function TaskPicture({ m, study }: { m: Messages; study: FlowStudy }) {
  return (
    <svg viewBox="0 0 316 110" className="mx-auto h-auto w-full max-w-80" aria-hidden="true" focusable="false" data-testid="task-picture">
      {study.task === 'spot' ? <SpotPicture m={m} locale={study.locale} /> : study.task === 'pick' ? <PickPicture m={m} locale={study.locale} /> : <TripPicture m={m} locale={study.locale} minutes={study.tripMinutes} />}
    </svg>
  );
}
