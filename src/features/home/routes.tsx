import type { ReactNode } from 'react';
import type { RouteObject } from 'react-router-dom';

/** The start page ("/"): Today for staff, My bikes for customers (with the app's extras). */
export function homeRoutes(customerExtras?: ReactNode): RouteObject[] {
  return [
    {
      index: true,
      lazy: async () => {
        const { HomePage } = await import('./pages/home-page');
        return { Component: () => <HomePage customerExtras={customerExtras} /> };
      },
    },
  ];
}
