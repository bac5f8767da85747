import type { ReactNode } from 'react';
import './print.css';

export default function ReportsLayout({ children }: { children: ReactNode }) {
  return children;
}
