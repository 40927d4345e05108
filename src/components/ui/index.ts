export { Button } from './button';
export { FieldShell, Input, PlainOptions, Select, TextArea } from './field';
export { Card, Notice, PageHeader, Spinner } from './card';
export { ErrorNotice } from './error-notice';
export { Confirm } from './confirm';
export { Term } from './term';
