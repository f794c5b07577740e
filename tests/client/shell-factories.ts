import type { CaseSummary, Member, Room } from '#shared/schemas/cases.ts';
import type { Me } from '#shared/schemas/session.ts';

// Invented test data (the demo unit's names, PRODUCT.md Demo scenario); ids are fixed, valid v4 UUIDs.
const unitId = '6f1c2a8e-3b4d-4c5e-9f6a-7b8c9d0e1f2a';

export function buildRoom(over: Partial<Room> = {}): Room {
  return { id: '0b7e4c1a-2d3f-4a5b-8c6d-9e0f1a2b3c4d', name: 'Room A', unitId, ...over };
}

export function buildMember(over: Partial<Member> = {}): Member {
  return { userId: 'user-nurse-1', name: 'Sofia Marin', email: 'sofia.marin@kestrelbay.example', role: 'nurse', ...over };
}

export function buildMe(over: Partial<Me> = {}): Me {
  return {
    user: { id: 'user-nurse-1', name: 'Sofia Marin', email: 'sofia.marin@kestrelbay.example' },
    unit: { id: unitId, name: 'Endoscopy Unit (level 3)', hospital: 'Kestrel Bay Hospital' },
    role: 'nurse',
    ...over,
  };
}

export function buildCase(over: Partial<CaseSummary> = {}): CaseSummary {
  const room = buildRoom();
  return {
    id: '5a4b3c2d-1e0f-4a9b-8c7d-6e5f4a3b2c1d',
    unitId,
    status: 'scheduled',
    procedureType: 'esd',
    scheduledAt: '2025-03-14T09:00:00.000Z',
    room,
    patient: { id: '9c8b7a6d-5e4f-4d3c-8b2a-1f0e9d8c7b6a', hospitalNumber: 'KB-000123', familyName: 'Testwood', givenName: 'Alex', birthDate: '1961-05-02', sex: 'female' },
    indication: 'Invented indication for a test',
    lesion: { site: 'gastric antrum', sizeMm: 32, paris: '0-IIa' },
    sedation: 'deep',
    endoscopist: { id: 'user-endo-1', name: 'Amara Osei' },
    nurse: { id: 'user-nurse-1', name: 'Sofia Marin' },
    ...over,
  };
}
