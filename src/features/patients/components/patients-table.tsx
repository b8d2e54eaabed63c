import { Link } from 'react-router-dom';
import type { Patient } from '../../../../shared/schemas/patients';
import { CheckCircleIcon, MinusIcon } from '../../../components/ui/icons';
import { paths } from '../../../config/paths';
import { formatCalendarDate } from '../../../lib/unit-times';
import { ageInYears } from './unit-dates';

export function PatientsTable({
  patients,
  searchText,
}: {
  patients: Patient[];
  searchText: string;
}) {
  return (
    <div className="overflow-x-auto rounded-2xl border border-paper-200 bg-white">
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">
          {searchText ? `Patients matching “${searchText}”` : 'Patients'}, {patients.length} shown.
          The record number opens the patient’s page.
        </caption>
        <thead className="bg-paper-100 text-sm text-paper-700">
          <tr>
            <th scope="col" className="px-3 py-2 pl-4 font-semibold whitespace-nowrap">
              Record number
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Name
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              Date of birth
            </th>
            <th scope="col" className="px-3 py-2 font-semibold">
              E-mail
            </th>
            <th scope="col" className="px-3 py-2 pr-4 font-semibold whitespace-nowrap">
              Agreed to e-mail
            </th>
          </tr>
        </thead>
        <tbody>
          {patients.map((patient) => {
            const age = ageInYears(patient.dateOfBirth);
            return (
              <tr key={patient.id} className="border-t border-paper-200 align-middle">
                <td className="px-3 py-3 pl-4">
                  <Link
                    to={paths.patient.getHref(patient.id)}
                    className="font-semibold text-iris-700 underline underline-offset-4 hover:text-iris-900"
                    aria-label={`${patient.recordNumber}, ${patient.familyName}, ${patient.givenName}`}
                  >
                    {patient.recordNumber}
                  </Link>
                </td>
                <td className="px-3 py-3">
                  <span className="font-medium text-paper-950">{patient.familyName}</span>,{' '}
                  {patient.givenName}
                </td>
                <td className="px-3 py-3 whitespace-nowrap">
                  {formatCalendarDate(patient.dateOfBirth)}
                  {age !== null && <span className="text-paper-600"> · {age} y</span>}
                </td>
                <td className="px-3 py-3">
                  {patient.email ? (
                    <span className="[overflow-wrap:anywhere]">{patient.email}</span>
                  ) : (
                    <span className="text-paper-600">None</span>
                  )}
                </td>
                <td className="px-3 py-3 pr-4">
                  <span className="inline-flex items-center gap-1.5 whitespace-nowrap">
                    {patient.emailConsent ? (
                      <CheckCircleIcon className="size-4" />
                    ) : (
                      <MinusIcon className="size-4" />
                    )}
                    {patient.emailConsent ? 'Yes' : 'No'}
                  </span>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
