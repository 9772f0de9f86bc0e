import type { ReactNode } from 'react';
import { SyncNote } from './SyncNote.tsx';

export function TopBar({
  title,
  back,
  children,
}: {
  title: string;
  back?: string;
  children?: ReactNode;
}) {
  return (
    <header className="topbar">
      {back ? (
        <a href={back} aria-label="Back">
          ‹ Back
        </a>
      ) : (
        <span className="wordmark">
          <img src="icons/icon.svg" alt="" />
        </span>
      )}
      <h1>{title}</h1>
      {children}
      <SyncNote />
    </header>
  );
}
