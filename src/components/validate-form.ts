import { nextTick } from 'vue';
import type { FormInstance } from 'element-plus';

/**
 * Validates a form; when it fails, the first field in error is brought into view and focused, so
 * a message at the top of a tall dialog is never missed (on a phone it lies far above the button).
 */
export async function validateForm(form: FormInstance | undefined): Promise<boolean> {
  if (!form) return false;
  const valid = await form.validate().catch(() => false);
  if (valid) return true;
  await nextTick();
  const root = (form as unknown as { $el?: Element }).$el;
  const item = root?.querySelector?.('.el-form-item.is-error');
  item?.scrollIntoView?.({ block: 'center' });
  item?.querySelector<HTMLElement>('input:not([type="hidden"]), textarea, [tabindex]:not([tabindex="-1"])')?.focus();
  return false;
}
