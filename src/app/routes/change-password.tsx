import { PageHeader } from '../../components/ui/page-header';
import { ChangePasswordForm } from '../../features/auth/components/change-password-form';

export function ChangePasswordRoute() {
  return (
    <>
      <title>Change password · Luxtempo</title>
      <PageHeader
        title="Change your password"
        lead="Your current password is needed. Changing it signs you out everywhere else."
      />
      <ChangePasswordForm />
    </>
  );
}
