import type { Permission, Role } from '#shared/permissions';

export const roleWord: Record<Role, string> = {
  bench: 'Bench',
  reviewer: 'Head baker (reviews changes)',
  author: 'Technical baker (writes formulas)',
  admin: 'Owner (accounts and costs)',
};

export const permissionWord: Record<Permission, string> = {
  'read:formula:active': 'Formulas in use',
  'read:formula:draft': 'Drafts and retired formulas',
  'read:history': 'Change history and comparisons',
  'read:plan': 'Bake days and batch sheets',
  'read:catalog': 'The ingredient list',
  'read:cost': 'Ingredient prices and cost per piece',
  'read:label': 'Ingredient statements and nutrition',
  'manage:users': 'Accounts',
  'read:record': 'Bench records and their photos',
  'write:record': 'Recording mixes and builds',
  'manage:records': 'Hiding a wrong record',
};
