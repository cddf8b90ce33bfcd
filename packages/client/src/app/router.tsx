import { createBrowserRouter, redirect, type RouteObject } from 'react-router-dom';
import { PageSpinner } from '../components/ui/spinner';
import { meKey } from '../features/auth/api/get-me';
import { leaveSignedInArea } from '../features/auth/leave-signed-in-area';
import { RouteError } from '../routes/errors/route-error';
import { NotFoundPage } from '../routes/errors/not-found';
import { RootLayout } from '../routes/root-layout';
import { SignedInLayout } from '../routes/signed-in/signed-in-layout';
import { onSessionLost, queryClient } from './query-client';
import { requireMe } from './route-guards';

// The shell (layout, guards, errors) ships in the first load; each screen is fetched when first visited.
/** The grow-out area's tabs, each its own lazy route so a breeder who only weighs groups never loads the charts. */
const growOutRoutes: RouteObject[] = [
  // Groups (index), forming one, a group's detail; the Feed tab.
  {
    index: true,
    lazy: async () => {
      const { loader, GroupsPage } = await import('../routes/grow-out/groups');
      return { loader, Component: GroupsPage };
    },
  },
  {
    path: 'groups/new',
    lazy: async () => {
      const { loader, GroupNewPage } = await import('../routes/grow-out/group-new');
      return { loader, Component: GroupNewPage };
    },
  },
  {
    path: 'groups/:groupId',
    lazy: async () => {
      const { loader, GroupDetailPage } = await import('../routes/grow-out/group-detail');
      return { loader, Component: GroupDetailPage };
    },
  },
  {
    path: 'feed',
    lazy: async () => {
      const { loader, FeedPage } = await import('../routes/grow-out/feed');
      return { loader, Component: FeedPage };
    },
  },
  // Health (treatments, withdrawals, temperature) and Processing (records, yields, marks).
  {
    path: 'health',
    lazy: async () => {
      const { loader, HealthPage } = await import('../routes/grow-out/health');
      return { loader, Component: HealthPage };
    },
  },
  {
    path: 'processing',
    lazy: async () => {
      const { loader, ProcessingPage } = await import('../routes/grow-out/processing');
      return { loader, Component: ProcessingPage };
    },
  },
  {
    path: 'performance',
    lazy: async () => {
      const { loader, PerformancePage } = await import('../routes/grow-out/performance');
      return { loader, Component: PerformancePage };
    },
  },
];

const adminRoutes: RouteObject[] = [
  { index: true, loader: () => redirect('/admin/applications') },
  {
    path: 'applications',
    lazy: async () => {
      const { loader, ApplicationsPage } = await import('../routes/admin/applications');
      return { loader, Component: ApplicationsPage };
    },
  },
  {
    path: 'applications/:applicationId',
    lazy: async () => {
      const { loader, ApplicationDetailPage } = await import('../routes/admin/application-detail');
      return { loader, Component: ApplicationDetailPage };
    },
  },
  {
    path: 'members',
    lazy: async () => {
      const { loader, MembersPage } = await import('../routes/admin/members');
      return { loader, Component: MembersPage };
    },
  },
  {
    path: 'members/invite',
    lazy: async () => {
      const { loader, InviteMemberPage } = await import('../routes/admin/invite-member');
      return { loader, Component: InviteMemberPage };
    },
  },
  {
    path: 'members/:userId',
    lazy: async () => {
      const { loader, MemberDetailPage } = await import('../routes/admin/member-detail');
      return { loader, Component: MemberDetailPage };
    },
  },
  {
    path: 'audit',
    lazy: async () => {
      const { loader, AuditPage } = await import('../routes/admin/audit');
      return { loader, Component: AuditPage };
    },
  },
  {
    path: 'rules',
    lazy: async () => {
      const { loader, RulesPage } = await import('../routes/admin/rules');
      return { loader, Component: RulesPage };
    },
  },
];

/** Stud Share: buck cards, the finder from a doe, a buck's page and offer, my requests and offers, a loan's page. */
const studShareRoutes: RouteObject[] = [
  {
    index: true,
    lazy: async () => {
      const { loader, BucksPage } = await import('../routes/stud-share/bucks');
      return { loader, Component: BucksPage };
    },
  },
  {
    path: 'find/:damId',
    lazy: async () => {
      const { loader, FinderPage } = await import('../routes/stud-share/finder');
      return { loader, Component: FinderPage };
    },
  },
  {
    path: 'bucks/:offerId',
    lazy: async () => {
      const { loader, BuckPage } = await import('../routes/stud-share/buck');
      return { loader, Component: BuckPage };
    },
  },
  {
    path: 'bucks/:offerId/edit',
    lazy: async () => {
      const { loader, OfferEditPage } = await import('../routes/stud-share/offer-edit');
      return { loader, Component: OfferEditPage };
    },
  },
  {
    path: 'offer',
    lazy: async () => {
      const { loader, OfferNewPage } = await import('../routes/stud-share/offer-new');
      return { loader, Component: OfferNewPage };
    },
  },
  {
    path: 'offers',
    lazy: async () => ({ Component: (await import('../routes/stud-share/my-offers')).MyOffersPage }),
  },
  {
    path: 'requests',
    lazy: async () => ({ Component: (await import('../routes/stud-share/requests')).RequestsPage }),
  },
  {
    path: 'loans/:loanId',
    lazy: async () => {
      const { loader, LoanPage } = await import('../routes/stud-share/loan');
      return { loader, Component: LoanPage };
    },
  },
];

/** Swap Board: the board, wanted posts, my listings and offers, a listing's page and the form to list. */
const swapBoardRoutes: RouteObject[] = [
  {
    index: true,
    lazy: async () => {
      const { loader, BoardPage } = await import('../routes/swap-board/board');
      return { loader, Component: BoardPage };
    },
  },
  {
    path: 'wanted',
    lazy: async () => ({ Component: (await import('../routes/swap-board/board')).WantedPage }),
  },
  {
    path: 'mine',
    lazy: async () => ({ Component: (await import('../routes/swap-board/my-listings')).MyListingsPage }),
  },
  {
    path: 'offers',
    lazy: async () => ({ Component: (await import('../routes/swap-board/my-offers')).MyOffersPage }),
  },
  {
    path: 'new',
    lazy: async () => ({ Component: (await import('../routes/swap-board/new-listing')).NewListingPage }),
  },
  {
    path: 'listings/:listingId',
    lazy: async () => {
      const { loader, ListingPage } = await import('../routes/swap-board/listing');
      return { loader, Component: ListingPage };
    },
  },
];

const routes: RouteObject[] = [
  {
    Component: RootLayout,
    errorElement: <RouteError standalone />,
    hydrateFallbackElement: <PageSpinner />,
    children: [
      {
        path: 'sign-in',
        lazy: async () => {
          const { loader, SignInPage } = await import('../routes/auth/sign-in');
          return { loader, Component: SignInPage };
        },
      },
      {
        path: 'forgot-password',
        lazy: async () => {
          const { loader, ForgotPasswordPage } = await import('../routes/auth/forgot-password');
          return { loader, Component: ForgotPasswordPage };
        },
      },
      {
        path: 'set-password',
        lazy: async () => ({ Component: (await import('../routes/auth/set-password')).SetPasswordPage }),
      },
      {
        // The public application form: the one screen where the co-op comes from the address.
        path: 'apply/:coopSlug',
        lazy: async () => {
          const { loader, ApplyPage } = await import('../routes/apply/apply');
          return { loader, Component: ApplyPage };
        },
      },
      {
        id: 'signed-in',
        loader: requireMe,
        Component: SignedInLayout,
        children: [
          {
            // Errors below keep the top bar, so there is always a way back.
            errorElement: <RouteError />,
            children: [
              {
                index: true,
                lazy: async () => {
                  const { loader, CommonsPage } = await import('../routes/commons/commons');
                  return { loader, Component: CommonsPage };
                },
              },
              {
                path: 'farms/:farmId',
                lazy: async () => {
                  const { loader, FarmProfilePage } = await import('../routes/farms/farm-profile');
                  return { loader, Component: FarmProfilePage };
                },
              },
              {
                path: 'farms/:farmId/edit',
                lazy: async () => {
                  const { loader, FarmEditPage } = await import('../routes/farms/farm-edit');
                  return { loader, Component: FarmEditPage };
                },
              },
              // The Herd: the farm's animals, one animal's page (full record or pedigree card), forms, trial matings.
              {
                path: 'herd',
                lazy: async () => {
                  const { loader, HerdPage } = await import('../routes/herd/herd');
                  return { loader, Component: HerdPage };
                },
              },
              {
                // The doe board: every doe of the farm with where she stands in her cycle and her next job.
                path: 'herd/does',
                lazy: async () => {
                  const { loader, DoeBoardPage } = await import('../routes/herd/doe-board');
                  return { loader, Component: DoeBoardPage };
                },
              },
              {
                // Herd records in: a spreadsheet staged, checked row by row, then confirmed.
                path: 'herd/import',
                lazy: async () => {
                  const { loader, HerdImportPage } = await import('../routes/herd/herd-import');
                  return { loader, Component: HerdImportPage };
                },
              },
              {
                path: 'co-op',
                lazy: async () => {
                  const { loader, CoopPage } = await import('../routes/co-op/co-op');
                  return { loader, Component: CoopPage };
                },
              },
              {
                path: 'chat',
                lazy: async () => {
                  const { loader, ChatPage } = await import('../routes/chat/chat');
                  return { loader, Component: ChatPage };
                },
              },
              {
                path: 'chat/:threadId',
                lazy: async () => {
                  const { loader, ChatPage } = await import('../routes/chat/chat');
                  return { loader, Component: ChatPage };
                },
              },
              {
                path: 'notifications',
                lazy: async () => {
                  const { loader, NotificationsPage } = await import('../routes/notifications/notifications');
                  return { loader, Component: NotificationsPage };
                },
              },
              // The Ledger: the farm's account, the co-op's books (admin), the card page's way back.
              {
                path: 'ledger',
                lazy: async () => {
                  const { loader, LedgerPage } = await import('../routes/ledger/ledger');
                  return { loader, Component: LedgerPage };
                },
              },
              {
                path: 'ledger/coop',
                lazy: async () => {
                  const { loader, CoopLedgerPage } = await import('../routes/ledger/coop');
                  return { loader, Component: CoopLedgerPage };
                },
              },
              {
                path: 'ledger/card-return',
                lazy: async () => {
                  const { CardReturnPage } = await import('../routes/ledger/card-return');
                  return { Component: CardReturnPage };
                },
              },
              {
                path: 'herd/new',
                lazy: async () => {
                  const { loader, AnimalNewPage } = await import('../routes/herd/animal-new');
                  return { loader, Component: AnimalNewPage };
                },
              },
              {
                path: 'herd/:animalId',
                lazy: async () => {
                  const { loader, AnimalPage } = await import('../routes/herd/animal');
                  return { loader, Component: AnimalPage };
                },
              },
              {
                path: 'herd/:animalId/edit',
                lazy: async () => {
                  const { loader, AnimalEditPage } = await import('../routes/herd/animal-edit');
                  return { loader, Component: AnimalEditPage };
                },
              },
              {
                path: 'herd/:animalId/trial-mating',
                lazy: async () => {
                  const { loader, TrialMatingPage } = await import('../routes/herd/trial-mating');
                  return { loader, Component: TrialMatingPage };
                },
              },
              {
                // The Almanac: agenda and month, services, settings; litters and their kit counts.
                path: 'almanac',
                lazy: async () => ({ Component: (await import('../routes/almanac/almanac')).AlmanacPage }),
              },
              {
                path: 'almanac/services/new',
                lazy: async () => {
                  const { loader, ServiceNewPage } = await import('../routes/almanac/service-new');
                  return { loader, Component: ServiceNewPage };
                },
              },
              {
                path: 'almanac/services/:serviceId',
                lazy: async () => {
                  const { loader, ServiceDetailPage } = await import('../routes/almanac/service-detail');
                  return { loader, Component: ServiceDetailPage };
                },
              },
              {
                path: 'almanac/settings',
                lazy: async () => {
                  const { loader, AlmanacSettingsPage } = await import('../routes/almanac/settings');
                  return { loader, Component: AlmanacSettingsPage };
                },
              },
              {
                path: 'almanac/housing',
                lazy: async () => {
                  const { loader, HousingPage } = await import('../routes/litters/housing');
                  return { loader, Component: HousingPage };
                },
              },
              {
                // A weighing round: many weights on a phone, one after another, saved as one batch.
                path: 'weighing-round',
                lazy: async () => {
                  const { loader, WeighingRoundPage } = await import('../routes/weighing/weighing-round');
                  return { loader, Component: WeighingRoundPage };
                },
              },
              {
                path: 'litters',
                lazy: async () => {
                  const { loader, LittersPage } = await import('../routes/litters/litters');
                  return { loader, Component: LittersPage };
                },
              },
              {
                path: 'litters/:litterId',
                lazy: async () => {
                  const { loader, LitterDetailPage } = await import('../routes/litters/litter-detail');
                  return { loader, Component: LitterDetailPage };
                },
              },
              {
                // Grow-out, feed, health, processing and performance share one layout; each tab is its own lazy route.
                path: 'grow-out',
                lazy: async () => ({ Component: (await import('../routes/grow-out/grow-out-layout')).GrowOutLayout }),
                children: growOutRoutes,
              },
              // Processing days: the upcoming days, one day's page, its summary, scheduling and the sites (admin).
              {
                path: 'processing-days',
                lazy: async () => {
                  const { loader, ProcessingDaysPage } = await import('../routes/processing-days/processing-days');
                  return { loader, Component: ProcessingDaysPage };
                },
              },
              {
                path: 'processing-days/new',
                lazy: async () => {
                  const { loader, ScheduleDayPage } = await import('../routes/processing-days/schedule');
                  return { loader, Component: ScheduleDayPage };
                },
              },
              {
                path: 'processing-days/sites',
                lazy: async () => {
                  const { loader, SitesPage } = await import('../routes/processing-days/sites');
                  return { loader, Component: SitesPage };
                },
              },
              {
                path: 'processing-days/:dayId',
                lazy: async () => {
                  const { loader, ProcessingDayPage } = await import('../routes/processing-days/day');
                  return { loader, Component: ProcessingDayPage };
                },
              },
              {
                path: 'processing-days/:dayId/summary',
                lazy: async () => {
                  const { loader, DaySummaryPage } = await import('../routes/processing-days/summary');
                  return { loader, Component: DaySummaryPage };
                },
              },
              {
                path: 'stud-share',
                lazy: async () => ({ Component: (await import('../routes/stud-share/stud-share-layout')).StudShareLayout }),
                children: studShareRoutes,
              },
              {
                path: 'swap-board',
                lazy: async () => ({ Component: (await import('../routes/swap-board/swap-board-layout')).SwapBoardLayout }),
                children: swapBoardRoutes,
              },
              {
                // Mentorship: the apprentice's log and skills; the mentor's review queue and apprentices; the admin reads all.
                path: 'mentorship',
                lazy: async () => ({ Component: (await import('../routes/mentorship/mentorship-layout')).MentorshipLayout }),
                children: [
                  {
                    index: true,
                    lazy: async () => {
                      const { loader, LogChorePage } = await import('../routes/mentorship/log-chore');
                      return { loader, Component: LogChorePage };
                    },
                  },
                  {
                    path: 'log',
                    lazy: async () => {
                      const { loader, MyLogPage } = await import('../routes/mentorship/my-log');
                      return { loader, Component: MyLogPage };
                    },
                  },
                  {
                    path: 'skills',
                    lazy: async () => {
                      const { loader, MySkillsPage } = await import('../routes/mentorship/my-skills');
                      return { loader, Component: MySkillsPage };
                    },
                  },
                  {
                    path: 'review',
                    lazy: async () => {
                      const { loader, ReviewPage } = await import('../routes/mentorship/review');
                      return { loader, Component: ReviewPage };
                    },
                  },
                  {
                    path: 'apprentices',
                    lazy: async () => {
                      const { loader, ApprenticesPage } = await import('../routes/mentorship/apprentices');
                      return { loader, Component: ApprenticesPage };
                    },
                  },
                  {
                    path: 'settings',
                    lazy: async () => {
                      const { loader, MentorshipSettingsPage } = await import('../routes/mentorship/settings');
                      return { loader, Component: MentorshipSettingsPage };
                    },
                  },
                  {
                    path: 'apprentices/:apprenticeId',
                    lazy: async () => {
                      const { loader, ApprenticePage } = await import('../routes/mentorship/apprentice');
                      return { loader, Component: ApprenticePage };
                    },
                  },
                ],
              },
              {
                // The co-op admin's area: applications, members, audit log, rules. Its loader turns non-admins away.
                path: 'admin',
                lazy: async () => {
                  const { loader, AdminLayout } = await import('../routes/admin/admin-layout');
                  const { AdminRouteError } = await import('../routes/admin/admin-error');
                  return { loader, Component: AdminLayout, ErrorBoundary: AdminRouteError };
                },
                children: adminRoutes,
              },
            ],
          },
        ],
      },
      { path: '*', Component: NotFoundPage },
    ],
  },
];

export const router = createBrowserRouter(routes);

onSessionLost(() => {
  // Only someone who was signed in can lose a session; a first visit signed out is the guard's job.
  if (!queryClient.getQueryData(meKey)) return;
  void leaveSignedInArea(queryClient, (to, options) => router.navigate(to, options), { notice: 'session-ended' });
});
