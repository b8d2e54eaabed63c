import { LinkButton } from '../../components/ui/button';
import { LockIcon } from '../../components/ui/icons';
import { StatusPanel } from '../../components/ui/status-panel';
import { paths } from '../../config/paths';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { LightCalculatorScreen } from '../../features/light-calculator/components/light-calculator-screen';
import { useSignedInUser } from '../layout/signed-in-user';

export function LightCalculatorRoute() {
  const user = useSignedInUser();
  return (
    <>
      <title>Light calculator · Luxtempo</title>
      {hasCapability(user, 'calculations.run') ? (
        <LightCalculatorScreen />
      ) : (
        <StatusPanel
          headingLevel="h1"
          icon={<LockIcon className="size-6" />}
          title="Running calculations is not part of your roles"
          actions={<LinkButton to={paths.today.getHref()}>Go to Today</LinkButton>}
        >
          <p>Ask an administrator if your roles need to change.</p>
        </StatusPanel>
      )}
    </>
  );
}
