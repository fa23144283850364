// Journey 1: a bookkeeper sets up workspaces for clients, renames one and deletes one —
// after cancelling once — and finds the list as left after a reload.
import { createWorkspace, expect, goToScreen, openApp, screenshotScreen, test, workspaceRow } from './support';

test('create, rename and delete workspaces, cancelling the first deletion', async ({ page }, testInfo) => {
  await openApp(page);
  await expect(page.getByRole('button', { name: 'Open the demo workspace' })).toBeVisible();
  await screenshotScreen(page, testInfo, 'welcome');

  await createWorkspace(page, 'Harbour Bakery');
  await createWorkspace(page, 'Fennel & Sons');
  const rows = page.getByTestId('workspace-row');
  await expect(rows).toHaveCount(2);
  await expect(workspaceRow(page, 'Fennel & Sons')).toHaveAttribute('data-current', 'true');
  await screenshotScreen(page, testInfo, 'workspaces');

  // Rename: the new name replaces the old one in the list.
  await page.getByRole('button', { name: 'Rename Harbour Bakery' }).click();
  const renameField = page.getByLabel('New name for Harbour Bakery');
  await expect(renameField).toHaveValue('Harbour Bakery');
  await renameField.fill('Harbour Bakery Ltd');
  await page.getByRole('button', { name: 'Save' }).click();
  await expect(workspaceRow(page, 'Harbour Bakery Ltd')).toBeVisible();
  await expect(workspaceRow(page, 'Harbour Bakery')).toHaveCount(0);

  // A name already taken is refused and nothing changes.
  await page.getByRole('button', { name: 'Rename Fennel & Sons' }).click();
  await page.getByLabel('New name for Fennel & Sons').fill('harbour bakery ltd');
  await page.getByRole('button', { name: 'Save' }).click();
  await expect(page.getByRole('alert')).toContainText('already exists');
  await page.getByRole('button', { name: 'Cancel' }).click();
  await expect(workspaceRow(page, 'Fennel & Sons')).toBeVisible();

  // Delete, but cancel: the dialog names what is lost, and nothing is deleted.
  await page.getByRole('button', { name: 'Delete Fennel & Sons' }).click();
  let dialog = page.getByRole('alertdialog', { name: 'Delete “Fennel & Sons”?' });
  await expect(dialog).toBeVisible();
  await expect(dialog).toContainText('0 transactions');
  await expect(dialog).toContainText('cannot be undone');
  await screenshotScreen(page, testInfo, 'workspace-delete-dialog', { themes: ['light'] });
  await dialog.getByRole('button', { name: 'Cancel' }).click();
  await expect(dialog).toBeHidden();
  await expect(rows).toHaveCount(2);
  await expect(workspaceRow(page, 'Fennel & Sons')).toBeVisible();

  // Delete for real.
  await page.getByRole('button', { name: 'Delete Fennel & Sons' }).click();
  dialog = page.getByRole('alertdialog', { name: 'Delete “Fennel & Sons”?' });
  await dialog.getByRole('button', { name: 'Delete Fennel & Sons' }).click();
  await expect(dialog).toBeHidden();
  await expect(rows).toHaveCount(1);
  await expect(workspaceRow(page, 'Fennel & Sons')).toHaveCount(0);
  // The remaining workspace is opened in place of the deleted one.
  await expect(workspaceRow(page, 'Harbour Bakery Ltd')).toHaveAttribute('data-current', 'true');

  // Everything as left after a reload.
  await page.reload();
  await goToScreen(page, 'Workspaces');
  await expect(rows).toHaveCount(1);
  await expect(workspaceRow(page, 'Harbour Bakery Ltd')).toHaveAttribute('data-current', 'true');
});
