// The notifications feature's public face: what routes, the layout and other features may use.
// Anything not exported here is internal to the feature (eslint.config.js enforces it).
export { NeedsYouList } from './components/needs-you-list';
export { NotificationBell } from './components/notification-bell';
export { NotificationList } from './components/notification-list';
export { NotificationSettings } from './components/notification-settings';
