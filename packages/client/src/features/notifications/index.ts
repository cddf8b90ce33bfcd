export { notificationKeys } from './api/keys';
export { useUnreadNotifications } from './api/get-notifications';
export { NotificationToast, type LatestNotification } from './components/notification-toast';
