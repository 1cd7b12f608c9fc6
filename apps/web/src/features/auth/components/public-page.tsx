import './sign-in.css';
import { Card } from '@blueprintjs/core';
import type { ReactNode } from 'react';

/** The card of the pages used without a session (sign-in, invitation, password reset). */
export function PublicPage({ title, children }: { title: string; children: ReactNode }) {
  return (
    <main className="sign-in-page" id="main">
      <title>{`${title} · Torquetrail`}</title>
      <Card className="sign-in-page__card" elevation={2}>
        <p className="sign-in-page__product">Torquetrail</p>
        <h1 className="sign-in-page__title">{title}</h1>
        {children}
      </Card>
    </main>
  );
}

export const PASSWORD_HELP = 'At least 12 characters. Not a commonly used password, and not your e-mail name.';
