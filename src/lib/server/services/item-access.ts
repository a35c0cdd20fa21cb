/** The one rule for reaching an item: its case must be visible to the caller (see caseService). */
import type { Knex } from 'knex';
import type { SessionUser } from '../../roles';
import { NotFoundError } from '../errors';
import { itemRepository, type ItemRow } from '../repositories/item.repository';
import { caseService } from './case.service';

export async function visibleItem(knex: Knex, user: SessionUser, itemId: number): Promise<ItemRow> {
	const item = await itemRepository(knex).findById(itemId);
	if (!item) throw new NotFoundError('Item');
	await caseService(knex).get(user, item.caseId);
	return item;
}
