/** Pullbook's shared UI kit. Features import from '@/components/ui', never from single files. */
export { cn, type ClassValue } from './cn';
export { Icon, type IconName, type IconProps } from './Icon';
export { Button, type ButtonProps, type ButtonSize, type ButtonVariant } from './Button';
export { IconButton, type IconButtonProps } from './IconButton';
export { Spinner, type SpinnerProps } from './Spinner';

export { errorMessage, fieldProblemsSummary, useFieldIds, type FieldErrorLike } from './field-utils';
export { FieldShell, type FieldBaseProps } from './Field';
export { TextField, type TextFieldProps } from './TextField';
export { NumberField, type NumberFieldProps } from './NumberField';
export { SelectField, type SelectFieldProps, type SelectOption } from './SelectField';
export { TextAreaField, type TextAreaFieldProps } from './TextAreaField';
export { CheckboxField, type CheckboxFieldProps } from './CheckboxField';
export { FormError, type FormErrorProps } from './FormError';
export { DialogActions, FormDialog, SubmitRow, type DialogActionsProps, type FormDialogProps } from './FormDialog';

export { Card, type CardProps } from './Card';
export { PageHeader, type PageHeaderProps } from './PageHeader';
export { Badge, type BadgeProps, type BadgeTone } from './Badge';
export { StatusBadge, type Status, type StatusBadgeProps } from './StatusBadge';
export { ProgressBar, type ProgressBarProps } from './ProgressBar';
export { LoadingState, type LoadingStateProps } from './LoadingState';
export { EmptyState, type EmptyStateProps } from './EmptyState';
export { ErrorState, type ErrorStateProps } from './ErrorState';
export { Stat, type StatDelta, type StatProps } from './Stat';
export { Caution, type CautionProps } from './Caution';

export { Dialog, type DialogProps } from './Dialog';
export { ConfirmDialog, type ConfirmDialogProps } from './ConfirmDialog';
export { ToastProvider, type ToastProviderProps } from './ToastProvider';
export { useToast } from './useToast';
export { useBottomBar } from './bottom-bar';
export type { ToastApi, ToastInput, ToastKind, ToastOptions } from './ToastContext';

export {
  DataTable,
  type DataTableConfigProps,
  type DataTableInstanceProps,
  type DataTableProps,
} from './DataTable';
export { Pagination, type PaginationProps } from './Pagination';
export { Tabs, type TabItem, type TabsProps } from './Tabs';
export { SimpleTable, type SimpleColumn, type SimpleTableProps } from './SimpleTable';
export { DropZone, type DropZoneProps } from './DropZone';
export { fileMatchesAccept, mergeFiles, type FileRejection, type FileRejectionReason } from './file-accept';
export { SearchInput, type SearchInputProps } from './SearchInput';
export { useDebouncedValue } from './useDebouncedValue';
export { buttonBaseClass, buttonSizeClass, buttonVariantClass, controlClass, toneSoftClass, type Tone } from './styles';
