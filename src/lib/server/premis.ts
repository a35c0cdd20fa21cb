/**
 * An item's custody history as PREMIS-style JSON: the object with its fixity, then one entry per
 * event with the PREMIS 3.0 semantic units (eventIdentifier, eventType, eventDateTime,
 * eventDetailInformation, eventOutcomeInformation, linkingAgentIdentifier,
 * linkingObjectIdentifier). Events without a PREMIS event type keep our own action name.
 * @see PREMIS Data Dictionary for Preservation Metadata, version 3.0 (Library of Congress, 2015)
 */
import type { ItemRow } from './repositories/item.repository';
import type { CustodyEventRow } from './repositories/custody.repository';

export function premisDocument(item: ItemRow, events: CustodyEventRow[]) {
	const objectId = { objectIdentifierType: 'stillpoint-item', objectIdentifierValue: String(item.id) };
	return {
		premisVersion: '3.0',
		object: {
			objectIdentifier: objectId,
			objectCategory: 'file',
			originalName: item.originalName,
			objectCharacteristics: {
				fixity: [
					{ messageDigestAlgorithm: 'SHA-256', messageDigest: item.sha256 },
					{ messageDigestAlgorithm: 'MD5', messageDigest: item.md5 }
				],
				size: item.sizeBytes,
				format: { formatName: item.format }
			}
		},
		events: events.map((event) => ({
			eventIdentifier: { eventIdentifierType: 'stillpoint-custody', eventIdentifierValue: String(event.id) },
			eventType: event.premisEventType ?? `stillpoint:${event.action}`,
			eventDateTime: event.occurredAt.toISOString(),
			eventDetailInformation: { eventDetail: event.action, eventDetailExtension: event.detail },
			eventOutcomeInformation: {
				eventOutcome: typeof event.detail.outcome === 'string' ? event.detail.outcome : 'success',
				hashBefore: event.hashBefore,
				hashAfter: event.hashAfter
			},
			linkingAgentIdentifier: {
				linkingAgentIdentifierType: event.actorId === null ? 'stillpoint-system' : 'stillpoint-user',
				linkingAgentIdentifierValue: event.actorId === null ? 'worker' : String(event.actorId),
				linkingAgentRole: event.actorRole
			},
			linkingObjectIdentifier: [
				objectId,
				...(event.runId === null ? [] : [{ objectIdentifierType: 'stillpoint-run', objectIdentifierValue: String(event.runId) }])
			],
			chain: { prevHash: event.prevHash, eventHash: event.eventHash }
		}))
	};
}
