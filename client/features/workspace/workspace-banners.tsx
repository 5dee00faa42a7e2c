/** What the room screen must say before anything else: lost access, a lost connection, a design that does not read. */
import type { RoomDocStatus } from './collab/use-room-doc';

export interface WorkspaceBannersProps {
  lostAccess: boolean;
  deleted: boolean;
  status: RoomDocStatus;
  everSynced: boolean;
  docError: string | null;
  analysisError: string | null;
  hasDesign: boolean;
}

function Banner({ tone, children, testId }: { tone: 'error' | 'warn'; children: React.ReactNode; testId?: string }) {
  return (
    <div
      role={tone === 'error' ? 'alert' : 'status'}
      data-testid={testId}
      className={
        tone === 'error'
          ? 'border-b border-coral/40 bg-coral-soft px-3 py-1.5 text-sm font-semibold text-coral-deep'
          : 'border-b border-amber/40 bg-amber-soft px-3 py-1.5 text-sm text-amber-deep'
      }
    >
      {children}
    </div>
  );
}

export function WorkspaceBanners(p: WorkspaceBannersProps) {
  if (p.lostAccess)
    return (
      <Banner tone="error" testId="banner-access">
        {p.deleted ? 'This room was deleted.' : 'You no longer have access to this room.'} What you see is the last state you received.
      </Banner>
    );
  return (
    <>
      {p.everSynced && p.status !== 'connected' && (
        <Banner tone="warn" testId="banner-connection">
          The connection to the room dropped; reconnecting. Your edits are kept and sent when it is back.
        </Banner>
      )}
      {p.docError && (
        <Banner tone="error" testId="banner-design">
          The room’s design has a problem a collaborator can fix: {p.docError}.{p.hasDesign ? ' Showing the last good version.' : ''}
        </Banner>
      )}
      {!p.docError && p.analysisError && (
        <Banner tone="error" testId="banner-analysis">
          {p.analysisError}
        </Banner>
      )}
    </>
  );
}
