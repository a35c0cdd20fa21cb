/**
 * The one rule for reaching an item: its case must be visible to the caller (see caseService),
 * and a client sees it only once a result of it has been released to them (issue 6 §5): until
 * then the lab's work in progress does not exist for them.
 */
import type { Knex } from 'knex';
import type { SessionUser } from '../../roles';
import { NotFoundError } from '../errors';
import { itemRepository, type ItemRow } from '../repositories/item.repository';
import { reportRepository } from '../repositories/report.repository';
import { caseService } from './case.service';

export async function assertClientMayRead(knex: Knex, user: SessionUser, item: ItemRow): Promise<void> {
	if (user.role === 'client' && !(await reportRepository(knex).latestForItem(item.id))) throw new NotFoundError('Item');
}

export async function visibleItem(knex: Knex, user: SessionUser, itemId: number): Promise<ItemRow> {
	const item = await itemRepository(knex).findById(itemId);
	if (!item) throw new NotFoundError('Item');
	await caseService(knex).get(user, item.caseId);
	await assertClientMayRead(knex, user, item);
	return item;
}
