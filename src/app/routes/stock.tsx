import { useSearchParams } from 'react-router-dom';
import { hasCapability } from '../../features/auth/hooks/use-session';
import { DrugUseScreen } from '../../features/stock/components/drug-use-screen';
import { RecallScreen } from '../../features/stock/components/recall-screen';
import { StockScreen } from '../../features/stock/components/stock-screen';
import { useSignedInUser } from '../layout/signed-in-user';
import { Gate } from './lists';

export function StockRoute() {
  const user = useSignedInUser();
  return (
    <Gate capability="stock.read" title="Stock" lockedTitle="Stock is kept by the pharmacy">
      <StockScreen canManage={hasCapability(user, 'stock.manage')} />
    </Gate>
  );
}

export function RecallRoute() {
  const [search] = useSearchParams();
  return (
    <Gate capability="stock.recall" title="Recall" lockedTitle="Recalls are run by the pharmacy">
      <RecallScreen initialLot={search.get('lot') ?? ''} />
    </Gate>
  );
}

export function DrugUseRoute() {
  return (
    <Gate
      capability="stock.read"
      title="Drug use"
      lockedTitle="The drug-use report is for the pharmacy"
    >
      <DrugUseScreen />
    </Gate>
  );
}
