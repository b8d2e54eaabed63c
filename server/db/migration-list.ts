// Every migration, oldest first. A new one is generated (see DEVELOPERS.md) and appended here;
// listing them as classes keeps the server, the CLI and the tests loading the same set.
import { Initial1796161380660 } from './migrations/1796161380660-Initial';
import { ProtocolVersions1796161598177 } from './migrations/1796161598177-ProtocolVersions';
import { OrdersAndOutbox1796162437763 } from './migrations/1796162437763-OrdersAndOutbox';
import { Sessions1796162826105 } from './migrations/1796162826105-Sessions';
import { AuditReview1796163852814 } from './migrations/1796163852814-AuditReview';
import { DoseRecordOrderFacts1796177175796 } from './migrations/1796177175796-DoseRecordOrderFacts';
import { DatabaseIntegrity1796200000000 } from './migrations/1796200000000-DatabaseIntegrity';
import { AccountsAndSessions1796293735643 } from './migrations/1796293735643-AccountsAndSessions';
import { PatientMeasurements1796293936378 } from './migrations/1796293936378-PatientMeasurements';
import { ProtocolVersionGuard1796293943222 } from './migrations/1796293943222-ProtocolVersionGuard';
import { SwellingAcknowledged1796294162239 } from './migrations/1796294162239-SwellingAcknowledged';
import { OrderRowVersion1796294215019 } from './migrations/1796294215019-OrderRowVersion';
import { PreparationHistory1796294636289 } from './migrations/1796294636289-PreparationHistory';
import { SignedOrderFactsKept1796297991104 } from './migrations/1796297991104-SignedOrderFactsKept';
import { OrderCancellation1796303351497 } from './migrations/1796303351497-OrderCancellation';
import { ProtocolSignaturesDiscardsAndSuperseded1796303358061 } from './migrations/1796303358061-ProtocolSignaturesDiscardsAndSuperseded';
import { SupersededReasonSigned1796309618215 } from './migrations/1796309618215-SupersededReasonSigned';
import { TreatmentListsAndStock1796313382388 } from './migrations/1796313382388-TreatmentListsAndStock';
import { FhirInterop1796313422761 } from './migrations/1796313422761-FhirInterop';
import { DevicesAndLenses1796313454504 } from './migrations/1796313454504-DevicesAndLenses';
import { FollowUpAndOutcomes1796313495700 } from './migrations/1796313495700-FollowUpAndOutcomes';

// One a line, oldest first, so that branches adding migrations merge line by line.
export const migrations = [
  Initial1796161380660,
  ProtocolVersions1796161598177,
  OrdersAndOutbox1796162437763,
  Sessions1796162826105,
  AuditReview1796163852814,
  DoseRecordOrderFacts1796177175796,
  DatabaseIntegrity1796200000000,
  AccountsAndSessions1796293735643,
  PatientMeasurements1796293936378,
  ProtocolVersionGuard1796293943222,
  SwellingAcknowledged1796294162239,
  OrderRowVersion1796294215019,
  PreparationHistory1796294636289,
  SignedOrderFactsKept1796297991104,
  OrderCancellation1796303351497,
  ProtocolSignaturesDiscardsAndSuperseded1796303358061,
  SupersededReasonSigned1796309618215,
  TreatmentListsAndStock1796313382388,
  FhirInterop1796313422761,
  DevicesAndLenses1796313454504,
  FollowUpAndOutcomes1796313495700,
];
