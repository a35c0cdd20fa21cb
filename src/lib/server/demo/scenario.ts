/**
 * The invented demo scenario: a county evidence unit and a city archive that do not exist,
 * with one account per role. Passwords are for the local demo only and are printed by the
 * start command and listed in the README.
 */
import type { Role } from '../../roles';
import type { CaseKind, CaseStatus } from '../../schemas/case';

export interface DemoUser {
	name: string;
	email: string;
	role: Role;
	password: string;
}

export const DEMO_USERS: DemoUser[] = [
	{ name: 'Avery Quist (admin)', email: 'admin@stillpoint.example', role: 'admin', password: 'demo-admin-pass' },
	{ name: 'Tamsin Vell (technician)', email: 'tech@stillpoint.example', role: 'technician', password: 'demo-tech-pass' },
	{ name: 'Orrin Blaydes (supervisor)', email: 'supervisor@stillpoint.example', role: 'supervisor', password: 'demo-super-pass' },
	{ name: 'Pell Marrow (client)', email: 'client@stillpoint.example', role: 'client', password: 'demo-client-pass' }
];

export interface DemoCase {
	title: string;
	reference: string;
	kind: CaseKind;
	status: CaseStatus;
	description: string;
	createdBy: string;
	members: string[];
}

export const DEMO_CASES: DemoCase[] = [
	{
		title: 'Quillmere County Evidence Unit — shaken car-park still, bay sign',
		reference: 'QCEU-2026-0142',
		kind: 'forensic',
		status: 'open',
		description:
			'Handheld still of the Fenwick Row car park at dusk; camera shake smears the bay sign. Requested: legibility of the sign for the investigating officer.',
		createdBy: 'tech@stillpoint.example',
		members: ['client@stillpoint.example']
	},
	{
		title: 'Quillmere County Evidence Unit — defocused document photograph',
		reference: 'QCEU-2026-0157',
		kind: 'forensic',
		status: 'in_review',
		description: 'A photographed delivery note, out of focus. Awaiting technical review.',
		createdBy: 'tech@stillpoint.example',
		members: []
	},
	{
		title: 'Ostravel City Archive — harbour print, 1962, soft focus',
		reference: 'OCA-1962-0033',
		kind: 'archival',
		status: 'released',
		description: 'Scanned silver-gelatin print of the Ostravel harbour crane; lens defocus. Released to the reading-room patron.',
		createdBy: 'tech@stillpoint.example',
		members: ['client@stillpoint.example']
	},
	{
		title: 'Ostravel City Archive — tram timetable board, motion blur',
		reference: 'OCA-1971-0108',
		kind: 'archival',
		status: 'open',
		description: 'Glass-plate scan of a tram stop; the timetable board is smeared by a slow shutter.',
		createdBy: 'admin@stillpoint.example',
		members: []
	}
];
