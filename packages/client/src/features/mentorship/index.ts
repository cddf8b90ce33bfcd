export { mentorshipKeys } from './api/keys';
export { MentorshipSummary } from './components/mentorship-summary';
export { useMyApprentices } from './hooks/use-my-apprentices';
