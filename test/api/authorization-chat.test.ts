import { describeMatrixArea } from '../support/authorization-cells';

describeMatrixArea('chat');
