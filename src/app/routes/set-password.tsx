import { useState } from 'react';
import { SetPasswordForm } from '../../features/auth/components/set-password-form';
import { PlainPage } from '../layout/plain-page';

/** Public: opened from an e-mailed link. The token is in the address's fragment, which no server or log sees. */
export function SetPasswordRoute() {
  const [token] = useState(() => window.location.hash.replace(/^#/, ''));
  return (
    <PlainPage>
      <title>Set your password · Luxtempo</title>
      <div className="mx-auto w-full max-w-sm rounded-2xl border border-paper-200 bg-white p-6 shadow-sm">
        <SetPasswordForm token={token} />
      </div>
    </PlainPage>
  );
}
