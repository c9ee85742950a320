declare module 'logic-solver'
