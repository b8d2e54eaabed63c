import { LinkButton } from '../../../components/ui/button';
import { InfoIcon, LockIcon } from '../../../components/ui/icons';
import { StatusPanel } from '../../../components/ui/status-panel';
import { paths } from '../../../config/paths';

/** For someone who reached a protocol page by a saved link without the right; the server refuses them too. */
export function ProtocolsLocked() {
  return (
    <StatusPanel
      headingLevel="h1"
      icon={<LockIcon className="size-6" />}
      title="Reading protocols is not part of your roles"
      actions={<LinkButton to={paths.today.getHref()}>Go to Today</LinkButton>}
    >
      <p>Ask an administrator if your roles need to change.</p>
    </StatusPanel>
  );
}

/** An address whose version number is not a whole number from 1 up. */
export function NoSuchVersion({ text }: { text: string }) {
  return (
    <StatusPanel
      headingLevel="h1"
      icon={<InfoIcon className="size-6" />}
      title="There is no such protocol version"
      actions={<LinkButton to={paths.protocols.getHref()}>See all protocols</LinkButton>}
    >
      <p>{text}</p>
    </StatusPanel>
  );
}

/** Version numbers in addresses are whole numbers from 1 to 100000, as the API accepts them. */
export function parseVersionNumber(value: string | undefined): number | null {
  if (!value || !/^\d{1,6}$/.test(value)) return null;
  const number = Number(value);
  return number >= 1 && number <= 100000 ? number : null;
}
