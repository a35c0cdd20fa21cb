/** Review, release, portal and verify services wired to this process's database, storage and mail. */
import { systemClock } from './clock';
import { db } from './db';
import { smtpMailer } from './mail';
import { portalService } from './services/portal.service';
import { releaseService } from './services/release.service';
import { reviewService } from './services/review.service';
import { verifyService } from './services/verify.service';
import { storage } from './storage';

export const reviews = () => reviewService(db(), { clock: systemClock, mailer: smtpMailer });
export const releases = () => releaseService(db(), { clock: systemClock, storage: storage(), mailer: smtpMailer });
export const portal = () => portalService(db(), { clock: systemClock, storage: storage() });
export const verifier = () => verifyService(db(), { clock: systemClock, storage: storage() });
