import { Router, type Request } from 'express';
import { ErrorCode, passwordResetRequestSchema, setPasswordSchema, signInSchema } from '@burrowline/shared';
import type { Config } from '../../config/env';
import { actorOf, requireUser } from '../../http/ability';
import type { SessionUser } from '../../lib/session-user';
import { passwordResetLimiter, signInAddressLimiter, SignInThrottle } from '../../http/rate-limit';
import { AppError } from '../../lib/app-error';
import { logger } from '../../lib/logger';
import { disconnectRoom, sessionRoom } from '../../lib/realtime';
import { recordAudit } from '../audit/audit.service';
import { findIdentityByEmail } from '../../http/passport';
import { describeMe, requestPasswordReset, setPasswordWithToken } from './auth.service';
import type { PassportStatic } from 'passport';

function ipOf(req: Request) {
  return req.ip ?? null;
}

export function authRoutes(config: Config, passport: PassportStatic): Router {
  const router = Router();
  const throttle = new SignInThrottle(config.signIn);

  router.get('/me', requireUser, async (req, res) => {
    res.json(await describeMe(actorOf(req)));
  });

  router.post('/session', signInAddressLimiter(config), throttle.middleware(), async (req, res, next) => {
    const input = signInSchema.parse(req.body);
    req.body = input;
    passport.authenticate('local', { session: false }, async (error: unknown, user: SessionUser | false) => {
      if (error) return next(error);
      if (!user) {
        const identity = await findIdentityByEmail(input.email).catch(() => null);
        await recordAudit({ coopId: identity?.coop_id ?? null, actorUserId: identity?.id ?? null, action: 'sign_in.failed', ip: ipOf(req) });
        logger.warn('sign-in failed', { coopId: identity?.coop_id, ip: ipOf(req) });
        // The same answer for an unknown e-mail and a wrong password (ASVS 6.3.8).
        return next(new AppError(ErrorCode.invalidCredentials, 401, 'That e-mail and password do not match an active account'));
      }
      // passport 0.7's login regenerates the session id (no fixation).
      req.login(user, async (loginError) => {
        if (loginError) return next(loginError);
        req.session.createdAt = Date.now();
        await recordAudit({ coopId: user.coopId, actorUserId: user.id, action: 'sign_in.succeeded', ip: ipOf(req) });
        logger.info('signed in', { userId: user.id, coopId: user.coopId });
        res.json(await describeMe(user));
      });
    })(req, res, next);
  });

  router.delete('/session', async (req, res, next) => {
    const user = req.user;
    const sessionId = req.sessionID;
    req.logout((error) => {
      if (error) return next(error);
      req.session.destroy(async (destroyError) => {
        if (destroyError) return next(destroyError);
        if (user) await recordAudit({ coopId: user.coopId, actorUserId: user.id, action: 'sign_out', ip: ipOf(req) });
        disconnectRoom(sessionRoom(sessionId), 'signed_out');
        res.clearCookie('burrowline.sid');
        res.status(204).end();
      });
    });
  });

  router.post('/password-resets', passwordResetLimiter(config), async (req, res) => {
    const input = passwordResetRequestSchema.parse(req.body);
    await requestPasswordReset({ email: input.email, ip: ipOf(req) }, { appUrl: config.appUrl, ttlMinutes: config.resetTokenTtlMinutes });
    res.status(202).json({ message: 'If that e-mail belongs to an account, a reset link is on its way.' });
  });

  router.post('/passwords', passwordResetLimiter(config), async (req, res) => {
    const input = setPasswordSchema.parse(req.body);
    const result = await setPasswordWithToken({ ...input, ip: ipOf(req) });
    throttle.forgetFailures(result.email);
    res.json({ email: result.email });
  });

  return router;
}
