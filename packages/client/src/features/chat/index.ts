export { chatKeys } from './api/keys';
export { useChatUnread, useChatThreads, useSubjectUnread } from './api/chat-api';
export { ChatThread, type ChatThreadProps } from './components/chat-thread';
export { ChatSummary } from './components/chat-summary';
export { ThreadList } from './components/thread-list';
export { ChatSearch } from './components/chat-search';
