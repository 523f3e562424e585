import { expect, test } from './fixtures.ts';
import { openFieldOnline, pickAsset } from './floor.ts';

test('a technician estimates a shaft with discs: one disc at mid-span gives the textbook value both ways, two discs are bracketed, and one becomes a mode', async ({
	page
}) => {
	await openFieldOnline(page);
	await pickAsset(page, 'KRW-SLP-601');
	await page.getByRole('tab', { name: 'Estimate from the structure' }).click();
	await page.getByLabel('Structure', { exact: true }).selectOption('discs');
	const calc = page.getByTestId('estimate-calculator');
	await calc.getByLabel(/^Young's modulus/).fill('210');
	await calc.getByLabel(/^Shaft diameter/).fill('60');
	await calc.getByLabel(/^Bearing span/).fill('1.2');
	await calc.getByLabel(/^Disc 1 mass/).fill('50');
	await calc.getByLabel(/^Disc 1 from the left bearing/).fill('0.6');
	// ω² = 48EI/(mL³) with I = π·0.06⁴/64: 43.36 Hz (a simply supported shaft, any handbook)
	const result = page.getByTestId('estimate-result');
	await expect(result).toContainText('Dunkerley (lower bound): 43.36 Hz');
	await expect(result).toContainText('Rayleigh (upper bound): 43.36 Hz');
	await calc.getByLabel(/^Disc 2 mass/).fill('30');
	await calc.getByLabel(/^Disc 2 from the left bearing/).fill('0.9');
	await expect(result).not.toContainText('43.36');
	const [low, high] = (await result.innerText()).match(/\d+\.\d+(?= Hz)/g)!.map(Number);
	expect(low).toBeLessThan(high);
	await calc.getByRole('button', { name: `Add ${low.toFixed(2)} Hz` }).click();
	await expect(page.getByTestId('modes-list')).toContainText(`${low.toFixed(2)} Hz`);
});
