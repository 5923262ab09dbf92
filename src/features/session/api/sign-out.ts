export { signOut } from './sign-in';
